import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { receiveSchema } from '@/lib/inventory/schemas';
import { receiveStock } from '@/lib/inventory/stock';

/** { partId, locationId, qty, note? } → the bin's new quantity. */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, receiveSchema);
  return NextResponse.json(await receiveStock(db, ctx, input));
});
