import { db } from '@/db';
import { now } from '@/lib/clock';
import { handle, parseQuery } from '@/lib/http/respond';
import { shelfReader } from '@/lib/inventory/access';
import { partsToCsv } from '@/lib/inventory/csv';
import { allMatchingParts } from '@/lib/inventory/parts-list';
import { partListQuerySchema } from '@/lib/inventory/schemas';

/** The parts table as CSV, with the same filters and order as the screen (no paging). */
export const GET = handle(async (req: Request) => {
  const ctx = await shelfReader();
  const query = parseQuery(req.url, partListQuerySchema);
  const [rows, space] = await Promise.all([
    allMatchingParts(db, ctx, query),
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  const csv = partsToCsv(rows, space.currency.trim());
  const day = now().toISOString().slice(0, 10);
  return new Response(`\ufeff${csv}`, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="parts-${day}.csv"`,
      'Cache-Control': 'no-store',
    },
  });
});
