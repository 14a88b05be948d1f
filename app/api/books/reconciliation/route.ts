import { route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { monthForBooks, reconcileForBooks } from '@/lib/reconcile/run';
import { monthQuery } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

export const GET = route({
  method: 'GET',
  summary:
    'The month’s sales beside the processor’s ledger, with totals (?month=YYYY-MM; without it, the latest month with sales or refunds)',
  who: ['treasurer'],
  query: monthQuery,
  response: record('The reconciliation: rows by match state and the month’s totals.'),
  run: async ({ ctx, query }) => reconcileForBooks(ctx, await monthForBooks(ctx, query.month)),
});
