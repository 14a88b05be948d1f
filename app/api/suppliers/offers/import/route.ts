import { z } from 'zod';
import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { importRequestSchema } from '@/lib/inventory/schemas';
import { commitOffersImport, previewOffersImport } from '@/lib/restock/offers-import';

export const POST = route({
  method: 'POST',
  summary: 'CSV import of supplier offers: a preview, or with ?commit=1 all rows in one transaction or none',
  who: STAFF,
  query: z.object({ commit: z.enum(['0', '1']).optional() }),
  body: json(importRequestSchema),
  response: record('Preview: rows, errors by row and field. Commit: how many offers were added and replaced.'),
  run: async ({ ctx, query, body }) =>
    query.commit === '1'
      ? Response.json(await commitOffersImport(db, ctx, body.csv), { status: 201 })
      : previewOffersImport(db, ctx, body.csv),
});
