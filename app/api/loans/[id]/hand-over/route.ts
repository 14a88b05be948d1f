import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { handOver } from '@/lib/loans/handover';

export const POST = route({
  method: 'POST',
  summary: 'Hands over a borrow waiting at the bench: it becomes a loan, due from now (once, whoever presses first)',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'loan',
  response: one('handedOver', 'The loan, its due date and who handed it over.'),
  run: async ({ ctx, params }) => ({ handedOver: await handOver(db, ctx, params.id) }),
});
