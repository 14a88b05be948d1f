import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { abandonCount, getCount, saveCountLines } from '@/lib/inventory/counts';
import { countLinesSchema } from '@/lib/inventory/schemas';

const count = record('The count: each line’s expected, counted, current quantity and variance.');

export const GET = route({
  method: 'GET',
  summary: 'A stock count with its lines',
  who: 'signed-in',
  params: idParams,
  notFound: 'count',
  response: count,
  run: ({ ctx, params }) => getCount(db, ctx, params.id),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Records counted figures ({ lines: [{ partId, counted }] })',
  who: STAFF,
  params: idParams,
  notFound: 'count',
  body: json(countLinesSchema),
  response: count,
  run: async ({ ctx, params, body }) => {
    await saveCountLines(db, ctx, params.id, body);
    return getCount(db, ctx, params.id);
  },
});

export const DELETE = route({
  method: 'DELETE',
  summary: 'Abandons an open count; the stock does not change',
  who: STAFF,
  params: idParams,
  notFound: 'count',
  response: record('{ abandoned }'),
  run: ({ ctx, params }) => abandonCount(db, ctx, params.id),
});
