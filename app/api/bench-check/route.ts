import { benchCheck } from '@/lib/bench-check';
import { kitSpecSchema } from '@/lib/electrical';
import { json, route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { z } from 'zod';

// Public: anyone may check a build (no sign-in, no database). The body is read strictly by
// lib/bench-check (every unknown key named at its path, the maths guarded so nothing answers 500);
// kitSpecSchema documents it.
export const POST = route({
  method: 'POST',
  summary: 'Checks a supply, driver and LED string together (public; no database)',
  who: 'anonymous',
  body: json(z.unknown(), kitSpecSchema),
  response: record('The report: verdict, figures with margins, findings and the safety cautions.'),
  run: async ({ body }) => benchCheck(body),
});
