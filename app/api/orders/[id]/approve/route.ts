import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { approveSchema } from '@/lib/restock/schemas';
import { approveOrder } from '@/lib/restock/send-order';

export const POST = route({
  method: 'POST',
  summary: 'An admin approves an order list past the month’s restocking budget, with a note',
  who: ['admin'],
  params: idParams,
  notFound: 'order',
  body: json(approveSchema),
  response: one('order', 'The order list, approved.'),
  run: ({ ctx, params, body }) => approveOrder(db, ctx, params.id, body.note),
});
