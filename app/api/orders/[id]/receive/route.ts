import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { receiveOrder } from '@/lib/restock/receive-order';
import { orderReceiveSchema } from '@/lib/restock/schemas';

export const POST = route({
  method: 'POST',
  summary: 'Receives what arrived against an order list (idempotent by its key); labelled parts get new units',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  body: json(orderReceiveSchema),
  response: record('The receipt: lines, new unit codes, cost at the price paid, the list’s state.'),
  run: ({ ctx, params, body }) => receiveOrder(db, ctx, params.id, body),
});
