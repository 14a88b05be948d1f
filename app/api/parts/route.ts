import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody, parseQuery } from '@/lib/http/respond';
import { shelfReader, shelfWriter } from '@/lib/inventory/access';
import { listParts } from '@/lib/inventory/parts-list';
import { createPart } from '@/lib/inventory/parts';
import { partCreateSchema, partListQuerySchema } from '@/lib/inventory/schemas';

/** The parts table: ?q=&category=&tracking=&below=1&sort=&dir=&page=&pageSize= */
export const GET = handle(async (req: Request) => {
  const ctx = await shelfReader();
  const query = parseQuery(req.url, partListQuerySchema);
  return NextResponse.json(await listParts(db, ctx, query));
});

export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, partCreateSchema);
  return NextResponse.json(await createPart(db, ctx, input), { status: 201 });
});
