import { checkKit, kitSpecSchema, safetyCautions } from '@/lib/electrical';
import { json, route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';

// Public: anyone may check a build (no sign-in, no database).
export const POST = route({
  method: 'POST',
  summary: 'Checks a supply, driver and LED string together (public; no database)',
  who: 'anonymous',
  body: json(kitSpecSchema),
  response: record('The report: verdict, figures with margins, findings and the safety cautions.'),
  run: async ({ body }) => {
    const report = checkKit(body);
    return { ...report, cautions: safetyCautions(body, report) };
  },
});
