import { z } from 'zod';
import { benchCompare, compareBodySchema } from '@/lib/bench-check';
import { json, route } from '@/lib/http/route';
import { listOf } from '@/lib/http/shapes';

// Public: buck vs linear vs series resistor for one string on one supply, read strictly by lib/bench-check.
export const POST = route({
  method: 'POST',
  summary: 'Buck vs linear vs series resistor for one LED string on one supply (public)',
  who: 'anonymous',
  body: json(z.unknown(), compareBodySchema),
  response: listOf('rows', 'One topology: efficiency, dissipation, verdict, rank and reason.'),
  run: async ({ body }) => benchCompare(body),
});
