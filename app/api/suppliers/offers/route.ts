import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { offerSchema } from '@/lib/restock/schemas';
import { saveOffer } from '@/lib/restock/suppliers';

export const POST = route({
  method: 'POST',
  summary: 'Adds or replaces a supplier’s offer for a part (their reference, pack size, price per pack)',
  who: STAFF,
  body: json(offerSchema),
  response: one('offer', 'The offer.'),
  run: ({ ctx, body }) => saveOffer(db, ctx, body),
});
