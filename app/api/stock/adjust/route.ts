import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { adjustSchema } from '@/lib/inventory/schemas';
import { adjustStock } from '@/lib/inventory/stock';

/** { partId, locationId, delta, reason: adjust|lost|damaged, note } — never below zero (409). */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, adjustSchema);
  return NextResponse.json(await adjustStock(db, ctx, input));
});
