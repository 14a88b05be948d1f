import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { listParts } from '@/lib/inventory/parts-list';
import { createPart } from '@/lib/inventory/parts';
import { partCreateSchema, partListQuerySchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'The parts table, paged, sorted and filtered (?q=&category=&tracking=&below=1&sort=&dir=&page=&pageSize=)',
  who: 'signed-in',
  query: partListQuerySchema,
  response: record('{ rows, total, page, pageSize, currency }'),
  run: ({ ctx, query }) => listParts(db, ctx, query),
});

export const POST = route({
  method: 'POST',
  summary: 'Creates a part (and, for labelled parts, its first units)',
  who: STAFF,
  body: json(partCreateSchema),
  status: 201,
  response: record('The new part.'),
  run: ({ ctx, body }) => createPart(db, ctx, body),
});
