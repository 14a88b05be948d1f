import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { moveSchema, moveUnitSchema } from '@/lib/inventory/schemas';
import { moveStock } from '@/lib/inventory/stock';
import { moveUnit } from '@/lib/inventory/units';

/** A body naming a unit moves that unit; anything else is a counted move (so errors name its fields). */
async function pickSchema(req: Request) {
  const raw: unknown = await req
    .clone()
    .json()
    .catch(() => null);
  return raw && typeof raw === 'object' && 'unitId' in raw ? moveUnitSchema : moveSchema;
}

/**
 * Counted stock: { partId, fromLocationId, toLocationId, qty, note? } (409 naming `qty` when the bin
 * holds fewer). A labelled unit: { unitId, toLocationId, note? }.
 */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const schema = await pickSchema(req);
  if (schema === moveUnitSchema)
    return NextResponse.json(await moveUnit(db, ctx, await parseJsonBody(req, moveUnitSchema)));
  return NextResponse.json(await moveStock(db, ctx, await parseJsonBody(req, moveSchema)));
});
