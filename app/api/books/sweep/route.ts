import { NextResponse } from 'next/server';
import { requireRole } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { sweepForBooks } from '@/lib/reconcile/run';

// POST: settle every overdue pending card sale of the space with the processor now.
export const POST = handle(async () => {
  const ctx = await requireRole('treasurer');
  const result = await sweepForBooks(ctx);
  return NextResponse.json({ sweep: { ...result, receipts: result.receipts.length } });
});
