import { NextResponse } from 'next/server';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseQuery } from '@/lib/http/respond';
import { monthOrCurrent, reconcileForBooks } from '@/lib/reconcile/run';
import { monthQuery } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

// GET ?month=YYYY-MM: the month's sales beside the processor's ledger, with totals.
export const GET = handle(async (req: Request) => {
  const ctx = await requireRole('treasurer');
  const { month } = parseQuery(req.url, monthQuery);
  return NextResponse.json(await reconcileForBooks(ctx, await monthOrCurrent(ctx, month)));
});
