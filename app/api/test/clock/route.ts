import { NextResponse } from 'next/server';
import { z } from 'zod';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { NotFoundError } from '@/lib/errors';
import { setClockOffset } from '@/lib/clock';

// Test hook: moves the app's clock. Answers 404 unless the app runs with OHM_TEST_HOOKS=1.
export const POST = handle(async (req: Request) => {
  if (process.env.OHM_TEST_HOOKS !== '1') throw new NotFoundError();
  const { offsetMs } = await parseJsonBody(req, z.object({ offsetMs: z.number().int().finite() }));
  setClockOffset(offsetMs);
  return NextResponse.json({ ok: true, offsetMs });
});
