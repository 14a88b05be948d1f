import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader, shelfWriter } from '@/lib/inventory/access';
import { createLocation, listLocations } from '@/lib/inventory/locations';
import { locationCreateSchema } from '@/lib/inventory/schemas';

export const GET = handle(async () => {
  const ctx = await shelfReader();
  return NextResponse.json({ locations: await listLocations(db, ctx) });
});

/** { name, kind?, parentId? } → the new location with its label code. */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, locationCreateSchema);
  return NextResponse.json(await createLocation(db, ctx, input), { status: 201 });
});
