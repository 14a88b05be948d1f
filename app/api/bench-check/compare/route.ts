import { NextResponse } from 'next/server';
import { z } from 'zod';
import { compareTopologies, stringSpecSchema, supplySpecSchema } from '@/lib/electrical';
import { handle, parseJsonBody } from '@/lib/http/respond';

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

// Public: buck vs linear vs series resistor for one string on one supply.
export const POST = handle(async (req: Request) => {
  const body = await parseJsonBody(req, compareBodySchema);
  const rows = compareTopologies(body.string, body.supply, { amps: body.amps, pwmDuty: body.pwmDuty });
  return NextResponse.json({ rows });
});
