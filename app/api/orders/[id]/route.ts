import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { orderDetail, updateOrder } from '@/lib/restock/orders';
import { orderPatchSchema } from '@/lib/restock/schemas';

export const GET = route({
  method: 'GET',
  summary: 'One order list: its lines, what arrived, its receipts',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  response: one('order', 'The order list.'),
  run: async ({ ctx, params }) => ({ order: await orderDetail(db, ctx, params.id) }),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes a draft order list: pack counts, dropped lines, note',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  body: json(orderPatchSchema),
  response: one('order', 'The order list.'),
  run: ({ ctx, params, body }) => updateOrder(db, ctx, params.id, body),
});
