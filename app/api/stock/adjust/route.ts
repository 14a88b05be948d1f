import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { adjustSchema } from '@/lib/inventory/schemas';
import { adjustStock } from '@/lib/inventory/stock';

export const POST = route({
  method: 'POST',
  summary: 'Adjusts a bin’s count (adjust, lost, damaged) — never below zero (409)',
  who: STAFF,
  body: json(adjustSchema),
  response: record('The bin’s new quantity.'),
  run: ({ ctx, body }) => adjustStock(db, ctx, body),
});
