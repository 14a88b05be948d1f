import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { unitStateSchema } from '@/lib/inventory/schemas';
import { changeUnitState } from '@/lib/inventory/units';

/** A unit to repair, back on the shelf, or retired: { state, reason, locationId? }. */
export const PATCH = handle(async (req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, unitStateSchema);
  const { id } = await params;
  return NextResponse.json(await changeUnitState(db, ctx, id, input));
});
