import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader, shelfWriter } from '@/lib/inventory/access';
import { listOpenCounts, openCount } from '@/lib/inventory/counts';
import { countOpenSchema } from '@/lib/inventory/schemas';

export const GET = handle(async () => {
  const ctx = await shelfReader();
  return NextResponse.json({ counts: await listOpenCounts(db, ctx) });
});

/** Opens a count for a bin ({ locationId }), or returns the one already open there. */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const { locationId } = await parseJsonBody(req, countOpenSchema);
  const opened = await openCount(db, ctx, locationId);
  return NextResponse.json(opened, { status: opened.created ? 201 : 200 });
});
