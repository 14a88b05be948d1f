import { z } from 'zod';
import { env } from '@/lib/env';
import { NotFoundError } from '@/lib/errors';
import { idSchema } from '@/lib/ids';
import { json, route } from '@/lib/http/route';
import { setTestPaymentsPort } from '@/lib/payments/client';

// Test hook: points one space's processor calls at another port (a test's own payments fake, or a closed
// port to play "processor down"). Compiled only into the test build; 404 unless OHM_TEST_HOOKS=1.
export const POST = route({
  method: 'POST',
  summary: 'Test hook: points a space’s processor calls at another port (test build only)',
  who: 'anonymous',
  body: json(z.object({ spaceId: idSchema, port: z.number().int().min(1).max(65535).nullable() })),
  run: async ({ body }) => {
    if (env().OHM_TEST_HOOKS !== '1') throw new NotFoundError();
    setTestPaymentsPort(body.spaceId, body.port);
    return { ok: true, spaceId: body.spaceId, port: body.port };
  },
});
