import { z } from 'zod';
import { compareTopologies, stringSpecSchema, supplySpecSchema } from '@/lib/electrical';
import { json, route } from '@/lib/http/route';
import { listOf } from '@/lib/http/shapes';

const compareBodySchema = z.object({
  string: stringSpecSchema,
  supply: supplySpecSchema,
  amps: z.number({ error: 'Drive current must be a number' }).positive({ error: 'Drive current must be greater than 0' }).optional(),
  pwmDuty: z
    .number({ error: 'PWM duty must be a number' })
    .positive({ error: 'PWM duty must be greater than 0' })
    .max(1, { error: 'PWM duty cannot be more than 1' })
    .optional(),
});

export const POST = route({
  method: 'POST',
  summary: 'Buck vs linear vs series resistor for one LED string on one supply (public)',
  who: 'anonymous',
  body: json(compareBodySchema),
  response: listOf('rows', 'One topology: efficiency, dissipation, verdict.'),
  run: async ({ body }) => ({
    rows: compareTopologies(body.string, body.supply, { amps: body.amps, pwmDuty: body.pwmDuty }),
  }),
});
