import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { getPartDetail } from '@/lib/inventory/part-detail';
import { updatePart } from '@/lib/inventory/parts';
import { partUpdateSchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'A part with its stock by bin, units, movements and attachments',
  who: 'signed-in',
  params: idParams,
  notFound: 'part',
  response: record('The part’s detail.'),
  run: ({ ctx, params }) => getPartDetail(db, ctx, params.id),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes a part’s fields',
  who: STAFF,
  params: idParams,
  notFound: 'part',
  body: json(partUpdateSchema),
  response: record('The part.'),
  run: ({ ctx, params, body }) => updatePart(db, ctx, params.id, body),
});
