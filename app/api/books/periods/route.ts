import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { closeMonth } from '@/lib/reconcile/close';
import { monthForBooks, reconcileForBooks, sweepForBooks } from '@/lib/reconcile/run';
import { closeMonthInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary:
    'Closes an ended month, keeping its reconciliation totals with the closing; with unresolved rows only when confirmUnresolved names how many',
  who: ['treasurer'],
  body: json(closeMonthInput),
  status: 201,
  response: record('{ closed, counts }'),
  run: async ({ ctx, body }) => {
    await monthForBooks(ctx, body.month);
    await sweepForBooks(ctx);
    const report = await reconcileForBooks(ctx, body.month);
    const closed = await closeMonth(db, ctx, body.month, report, body.confirmUnresolved);
    return { closed, counts: report.totals.counts };
  },
});
