import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { receiveSchema } from '@/lib/inventory/schemas';
import { receiveStock } from '@/lib/inventory/receive';

export const POST = route({
  method: 'POST',
  summary: 'Receives stock: counted into a bin, or new labelled units (their codes answered)',
  who: STAFF,
  body: json(receiveSchema),
  response: record('The bin’s new quantity.'),
  run: ({ ctx, body }) => receiveStock(db, ctx, body),
});
