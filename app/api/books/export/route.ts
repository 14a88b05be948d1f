import { route } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { reconciliationCsv } from '@/lib/reconcile/csv';
import { monthOrCurrent, reconcileForBooks } from '@/lib/reconcile/run';
import { monthQuery } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

export const GET = route({
  method: 'GET',
  summary: 'The month’s reconciliation as a CSV download (?month=YYYY-MM)',
  who: ['treasurer'],
  query: monthQuery,
  produces: CSV,
  run: async ({ ctx, query }) => {
    const report = await reconcileForBooks(ctx, await monthOrCurrent(ctx, query.month));
    return new Response(reconciliationCsv(report), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="ohmstead-reconciliation-${report.month}.csv"`,
        'cache-control': 'no-store',
      },
    });
  },
});
