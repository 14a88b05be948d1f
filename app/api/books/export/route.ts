import { requireRole } from '@/lib/auth/guard';
import { handle, parseQuery } from '@/lib/http/respond';
import { reconciliationCsv } from '@/lib/reconcile/csv';
import { monthOrCurrent, reconcileForBooks } from '@/lib/reconcile/run';
import { monthQuery } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

// GET ?month=YYYY-MM: the reconciliation as a CSV download for the books.
export const GET = handle(async (req: Request) => {
  const ctx = await requireRole('treasurer');
  const { month } = parseQuery(req.url, monthQuery);
  const report = await reconcileForBooks(ctx, await monthOrCurrent(ctx, month));
  return new Response(reconciliationCsv(report), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="ohmstead-reconciliation-${report.month}.csv"`,
      'cache-control': 'no-store',
    },
  });
});
