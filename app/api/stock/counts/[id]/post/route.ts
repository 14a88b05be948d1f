import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle } from '@/lib/http/respond';
import { shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { postCount } from '@/lib/inventory/counts';

/** Posts the count: counted figures become the bin's stock, each difference a 'count' movement. */
export const POST = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const { id } = await params;
  return NextResponse.json(await postCount(db, ctx, id));
});
