import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { commitImport, previewImport } from '@/lib/inventory/csv-import';
import { importRequestSchema } from '@/lib/inventory/schemas';

/**
 * CSV import of parts and stock. `POST { csv }` previews (row-by-row errors, nothing written);
 * `POST ?commit=1 { csv }` imports all rows in one transaction, or none (400 naming `rows.<row>.<field>`).
 */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const { csv } = await parseJsonBody(req, importRequestSchema);
  if (new URL(req.url).searchParams.get('commit') === '1') {
    return NextResponse.json(await commitImport(db, ctx, csv), { status: 201 });
  }
  return NextResponse.json(await previewImport(db, ctx, csv));
});
