import { z } from 'zod';
import { route } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { reconciliationCsv, totalsCsv } from '@/lib/reconcile/csv';
import { monthForBooks, reconcileForBooks } from '@/lib/reconcile/run';
import { monthInput } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

// Two files, so no column ever mixes rows with their sums: the rows (one per sale payment, refund or
// refused payment) and, separately, the month's totals.
const exportQuery = z.object({
  month: monthInput.optional(),
  part: z.enum(['rows', 'totals']).default('rows'),
});

export const GET = route({
  method: 'GET',
  summary:
    'The month’s reconciliation as a CSV download (?month=YYYY-MM; &part=totals for the totals file), times in the space’s zone with their offset',
  who: ['treasurer'],
  query: exportQuery,
  produces: CSV,
  run: async ({ ctx, query }) => {
    const report = await reconcileForBooks(ctx, await monthForBooks(ctx, query.month));
    const totals = query.part === 'totals';
    return new Response(totals ? totalsCsv(report) : reconciliationCsv(report), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="ohmstead-books-${report.month}${totals ? '-totals' : ''}.csv"`,
        'cache-control': 'no-store',
      },
    });
  },
});
