import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { closeMonth } from '@/lib/reconcile/close';
import { reconcileForBooks, sweepForBooks } from '@/lib/reconcile/run';
import { closeMonthInput } from '@/lib/sales/schemas';

// POST { month }: closes an ended month, keeping its reconciliation totals with the closing.
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('treasurer');
  const { month } = await parseJsonBody(req, closeMonthInput);
  await sweepForBooks(ctx);
  const report = await reconcileForBooks(ctx, month);
  const closed = await closeMonth(db, ctx, month, report);
  return NextResponse.json({ closed, counts: report.totals.counts }, { status: 201 });
});
