import { z } from 'zod';
import { route } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { reconciliationCsv, totalsCsv } from '@/lib/reconcile/csv';
import { filingForBooks, monthForBooks, reconcileForBooks } from '@/lib/reconcile/run';
import { filingCsv, filingTotalsCsv } from '@/lib/reconcile/filing-csv';
import { monthInput } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

// Files in pairs, so no column ever mixes rows with their sums: the reconciliation's rows (one per sale
// payment, refund or refused payment) and its totals; the books for filing (every sale line, tax,
// refunds, fees, write-offs, the honour box, each in its own section) and the sums of those sections.
const exportQuery = z.object({
  month: monthInput.optional(),
  part: z.enum(['rows', 'totals', 'filing', 'filing-totals']).default('rows'),
});

const csvFile = (body: string, name: string) =>
  new Response(body, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${name}"`,
      'cache-control': 'no-store',
    },
  });

export const GET = route({
  method: 'GET',
  summary:
    'The month’s books as a CSV download (?month=YYYY-MM; &part=totals for the totals; &part=filing for every sale line, tax, refund, fee, write-off and honour-box entry by section, amounts in minor units; &part=filing-totals for their sums), times in the space’s zone with their offset',
  who: ['treasurer'],
  query: exportQuery,
  produces: CSV,
  run: async ({ ctx, query }) => {
    const month = await monthForBooks(ctx, query.month);
    if (query.part === 'filing' || query.part === 'filing-totals') {
      const { report, filing, totals } = await filingForBooks(ctx, month);
      const c = { month: report.month, timeZone: report.timeZone, currency: report.currency };
      return query.part === 'filing'
        ? csvFile(filingCsv(filing, c), `ohmstead-filing-${report.month}.csv`)
        : csvFile(filingTotalsCsv(totals, c), `ohmstead-filing-${report.month}-totals.csv`);
    }
    const report = await reconcileForBooks(ctx, month);
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
