import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { one, record } from '@/lib/http/shapes';
import { createOrder, listOrders } from '@/lib/restock/orders';
import { orderCreateSchema } from '@/lib/restock/schemas';

export const GET = route({
  method: 'GET',
  summary: 'Order lists, newest first, with this month’s restocking budget, committed and received',
  who: STAFF,
  response: record('{ orders, budget }'),
  run: ({ ctx }) => listOrders(db, ctx),
});

export const POST = route({
  method: 'POST',
  summary: 'Starts an order list to one supplier from parts and pack counts, priced from its offers',
  who: STAFF,
  body: json(orderCreateSchema),
  status: 201,
  response: one('order', 'The new order list (a draft).'),
  run: ({ ctx, body }) => createOrder(db, ctx, body),
});
