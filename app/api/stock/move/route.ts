import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { stockMoveDoc, stockMoveSchema } from '@/lib/inventory/schemas';
import { moveStock } from '@/lib/inventory/stock';
import { moveUnit } from '@/lib/inventory/units';

export const POST = route({
  method: 'POST',
  summary: 'Moves counted stock between bins ({ partId, fromLocationId, toLocationId, qty }) or a unit ({ unitId, toLocationId })',
  who: STAFF,
  body: json(stockMoveSchema, stockMoveDoc),
  response: record('The bins’ new quantities, or the unit’s new place.'),
  run: ({ ctx, body }) => (body.kind === 'unit' ? moveUnit(db, ctx, body.move) : moveStock(db, ctx, body.move)),
});
