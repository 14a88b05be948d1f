import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfReader } from '@/lib/inventory/access';
import { existingCodes } from '@/lib/inventory/resolve';
import { codesLookupSchema } from '@/lib/inventory/schemas';

/** "Did you mean": of these candidate codes ({ codes: [...] }, at most 20), the ones that exist here. */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfReader();
  const { codes } = await parseJsonBody(req, codesLookupSchema);
  return NextResponse.json({ found: await existingCodes(db, ctx, codes) });
});
