import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { addUnitsSchema } from '@/lib/inventory/schemas';
import { addUnits } from '@/lib/inventory/receive';

export const POST = route({
  method: 'POST',
  summary: 'Labels new units of a labelled part ({ count, locationId?, serialPrefix? })',
  who: STAFF,
  params: idParams,
  notFound: 'part',
  body: json(addUnitsSchema),
  status: 201,
  response: record('The new units with their label codes.'),
  run: ({ ctx, params, body }) => addUnits(db, ctx, params.id, body),
});
