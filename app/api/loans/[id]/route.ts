import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { getLoan } from '@/lib/loans/queries';

export const GET = route({
  method: 'GET',
  summary: 'One loan with its lines and the stored check report',
  who: 'signed-in',
  params: idParams,
  notFound: 'loan',
  response: one('loan', 'The loan.'),
  run: async ({ ctx, params }) => ({ loan: await getLoan(db, ctx, params.id) }),
});
