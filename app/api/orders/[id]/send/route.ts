import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { sendSchema } from '@/lib/restock/schemas';
import { sendOrder } from '@/lib/restock/send-order';

export const POST = route({
  method: 'POST',
  summary: 'Sends an order list to its supplier by e-mail with a CSV; past the month’s budget it needs an admin’s approval',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  body: json(sendSchema),
  response: one('order', 'The order list, now with the supplier.'),
  run: ({ ctx, params, body }) => sendOrder(db, ctx, params.id, body),
});
