import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader, shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { getPartDetail } from '@/lib/inventory/part-detail';
import { updatePart } from '@/lib/inventory/parts';
import { partUpdateSchema } from '@/lib/inventory/schemas';

export const GET = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfReader();
  const { id } = await params;
  return NextResponse.json(await getPartDetail(db, ctx, id));
});

export const PATCH = handle(async (req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, partUpdateSchema);
  const { id } = await params;
  return NextResponse.json(await updatePart(db, ctx, id, input));
});
