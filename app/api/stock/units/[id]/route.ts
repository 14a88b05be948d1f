import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { unitStateSchema } from '@/lib/inventory/schemas';
import { changeUnitState } from '@/lib/inventory/units';

export const PATCH = route({
  method: 'PATCH',
  summary: 'Sends a unit to repair, back on the shelf, or retires it ({ state, reason, locationId? })',
  who: STAFF,
  params: idParams,
  notFound: 'unit',
  body: json(unitStateSchema),
  response: record('The unit.'),
  run: ({ ctx, params, body }) => changeUnitState(db, ctx, params.id, body),
});
