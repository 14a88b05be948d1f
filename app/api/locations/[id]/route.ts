import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader, shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { deleteLocation, getLocation, updateLocation } from '@/lib/inventory/locations';
import { locationUpdateSchema } from '@/lib/inventory/schemas';

export const GET = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfReader();
  const { id } = await params;
  return NextResponse.json(await getLocation(db, ctx, id));
});

export const PATCH = handle(async (req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, locationUpdateSchema);
  const { id } = await params;
  return NextResponse.json(await updateLocation(db, ctx, id, input));
});

/** Only an empty location can be removed (409 otherwise). */
export const DELETE = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const { id } = await params;
  return NextResponse.json(await deleteLocation(db, ctx, id));
});
