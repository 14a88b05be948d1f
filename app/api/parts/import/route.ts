import { z } from 'zod';
import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { commitImport, previewImport } from '@/lib/inventory/csv-import';
import { importRequestSchema } from '@/lib/inventory/schemas';

export const POST = route({
  method: 'POST',
  summary: 'CSV import of parts and stock: a preview, or with ?commit=1 all rows in one transaction or none',
  who: STAFF,
  query: z.object({ commit: z.enum(['0', '1']).optional() }),
  body: json(importRequestSchema),
  response: record('Preview: rows, errors by row and field. Commit: what was created.'),
  run: async ({ ctx, query, body }) =>
    query.commit === '1'
      ? Response.json(await commitImport(db, ctx, body.csv), { status: 201 })
      : previewImport(db, ctx, body.csv),
});
