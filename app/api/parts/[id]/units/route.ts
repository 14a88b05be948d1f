import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { addUnitsSchema } from '@/lib/inventory/schemas';
import { addUnits } from '@/lib/inventory/units';

/** Labels new units of a labelled part: { count, locationId?, serialPrefix? }. */
export const POST = handle(async (req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, addUnitsSchema);
  const { id } = await params;
  return NextResponse.json(await addUnits(db, ctx, id, input), { status: 201 });
});
