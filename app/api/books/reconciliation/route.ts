import { route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { monthOrCurrent, reconcileForBooks } from '@/lib/reconcile/run';
import { monthQuery } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

export const GET = route({
  method: 'GET',
  summary: 'The month’s sales beside the processor’s ledger, with totals (?month=YYYY-MM)',
  who: ['treasurer'],
  query: monthQuery,
  response: record('The reconciliation: rows by match state and the month’s totals.'),
  run: async ({ ctx, query }) => reconcileForBooks(ctx, await monthOrCurrent(ctx, query.month)),
});
