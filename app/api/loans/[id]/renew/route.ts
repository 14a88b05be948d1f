import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { renewLoan } from '@/lib/loans/renew';

export const POST = route({
  method: 'POST',
  summary: 'Renews a loan once, unless someone is waiting for it',
  who: 'signed-in',
  params: idParams,
  notFound: 'loan',
  response: one('renewed', 'The loan’s new due date.'),
  run: async ({ ctx, params }) => ({ renewed: await renewLoan(db, ctx, params.id) }),
});
