import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader, shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { abandonCount, getCount, saveCountLines } from '@/lib/inventory/counts';
import { countLinesSchema } from '@/lib/inventory/schemas';

/** The count with each line's expected, counted, current quantity and variance. */
export const GET = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfReader();
  const { id } = await params;
  return NextResponse.json(await getCount(db, ctx, id));
});

/** Records counts: { lines: [{ partId, counted }] }. */
export const PATCH = handle(async (req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, countLinesSchema);
  const { id } = await params;
  await saveCountLines(db, ctx, id, input);
  return NextResponse.json(await getCount(db, ctx, id));
});

/** Abandons an open count; the stock does not change. */
export const DELETE = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const { id } = await params;
  return NextResponse.json(await abandonCount(db, ctx, id));
});
