import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { paymentsClient } from '@/lib/payments/client';
import { refundSale } from '@/lib/sales/refunds';
import { refundInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary: 'A refund by the treasurer, whole or per line, optionally restocking',
  who: ['treasurer'],
  params: idParams,
  notFound: 'sale',
  body: json(refundInput),
  status: 201,
  response: one('refund', 'The refund.'),
  run: async ({ ctx, params, body }) => ({
    refund: await refundSale(db, ctx, params.id, body, paymentsClient(ctx.spaceId)),
  }),
});
