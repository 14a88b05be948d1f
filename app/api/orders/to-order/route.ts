import { db } from '@/db';
import { route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { whatToOrder } from '@/lib/restock/to-order-query';

export const GET = route({
  method: 'GET',
  summary: 'What to order: parts short of their reorder point, holds and 90-day sales over the lead time, in whole packs, by supplier',
  who: STAFF,
  response: record('{ groups, totalMinor, lineCount, currency }'),
  run: ({ ctx }) => whatToOrder(db, ctx),
});
