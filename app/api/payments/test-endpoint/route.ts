import { NextResponse } from 'next/server';
import { z } from 'zod';
import { NotFoundError } from '@/lib/errors';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { setTestPaymentsPort } from '@/lib/payments/client';

// Test hook: points one space's processor calls at another port (a test's own payments fake, or a
// closed port to play "processor down"). Answers 404 unless the app runs with OHM_TEST_HOOKS=1.
export const POST = handle(async (req: Request) => {
  if (process.env.OHM_TEST_HOOKS !== '1') throw new NotFoundError();
  const { spaceId, port } = await parseJsonBody(
    req,
    z.object({ spaceId: z.uuid(), port: z.number().int().min(1).max(65535).nullable() }),
  );
  setTestPaymentsPort(spaceId, port);
  return NextResponse.json({ ok: true, spaceId, port });
});
