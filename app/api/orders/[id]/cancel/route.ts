import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { cancelOrder } from '@/lib/restock/orders';
import { cancelSchema } from '@/lib/restock/schemas';

export const POST = route({
  method: 'POST',
  summary: 'Calls off an order list; what already arrived stays',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  body: json(cancelSchema),
  response: one('order', 'The order list, called off.'),
  run: ({ ctx, params, body }) => cancelOrder(db, ctx, params.id, body.note),
});
