import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { receiveSchema } from '@/lib/inventory/schemas';
import { receiveStock } from '@/lib/inventory/stock';

export const POST = route({
  method: 'POST',
  summary: 'Receives stock into a bin ({ partId, locationId, qty, note? })',
  who: STAFF,
  body: json(receiveSchema),
  response: record('The bin’s new quantity.'),
  run: ({ ctx, body }) => receiveStock(db, ctx, body),
});
