import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { borrowWithDeposit } from '@/lib/deposits/borrow';
import { paymentsDeps } from '@/lib/payments/client';
import { listLoans } from '@/lib/loans/queries';
import { borrowSchema, loanFilterSchema } from '@/lib/loans/schemas';

export const GET = route({
  method: 'GET',
  summary: 'My loans (stewards: everyone’s, or ?mine=1)',
  who: 'signed-in',
  query: loanFilterSchema,
  response: listOf('loans', 'A loan.'),
  run: async ({ ctx, query }) => ({ loans: await listLoans(db, ctx, query.status, { mine: query.mine === '1' }) }),
});

export const POST = route({
  method: 'POST',
  summary:
    'Borrows a box or loose parts; the check runs again on the server. A kit that asks for a deposit answers with its pay page (deposit.url); it is a loan once paid',
  who: 'signed-in',
  body: json(borrowSchema),
  status: 201,
  response: one('loan', 'The new loan.'),
  run: async ({ ctx, body }) => ({ loan: await borrowWithDeposit(db, ctx, body, () => paymentsDeps(ctx.spaceId)) }),
});
