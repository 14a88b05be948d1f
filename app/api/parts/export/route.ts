import { db } from '@/db';
import { now } from '@/lib/clock';
import { route } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { exportPartsCsv } from '@/lib/inventory/parts-list';
import { partListQuerySchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'The parts table as CSV, with the same filters and order as the screen (no paging)',
  who: 'signed-in',
  query: partListQuerySchema,
  produces: CSV,
  run: async ({ ctx, query }) => {
    const csv = await exportPartsCsv(db, ctx, query);
    const day = now().toISOString().slice(0, 10);
    return new Response(`\ufeff${csv}`, {
      headers: {
        'Content-Type': 'text/csv; charset=utf-8',
        'Content-Disposition': `attachment; filename="parts-${day}.csv"`,
        'Cache-Control': 'no-store',
      },
    });
  },
});
