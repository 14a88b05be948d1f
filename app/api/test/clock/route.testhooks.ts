import { z } from 'zod';
import { setClockOffset } from '@/lib/clock';
import { env } from '@/lib/env';
import { NotFoundError } from '@/lib/errors';
import { json, route } from '@/lib/http/route';

// Test hook: moves the app's clock. Compiled only into the test build (scripts/test.sh); even there it
// answers 404 unless the app runs with OHM_TEST_HOOKS=1.
export const POST = route({
  method: 'POST',
  summary: 'Test hook: moves the app’s clock (test build only)',
  who: 'anonymous',
  body: json(z.object({ offsetMs: z.number().int().finite() })),
  response: z.object({ ok: z.literal(true), offsetMs: z.number() }),
  run: async ({ body }) => {
    if (env().OHM_TEST_HOOKS !== '1') throw new NotFoundError();
    setClockOffset(body.offsetMs);
    return { ok: true, offsetMs: body.offsetMs };
  },
});
