import { db } from '@/db';
import { now } from '@/lib/clock';
import { route, STAFF } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { exportOffersCsv } from '@/lib/restock/offers-import';

export const GET = route({
  method: 'GET',
  summary: 'Every supplier offer as CSV (supplier, SKU, their reference, pack size, price per pack, preferred), to edit and import back',
  who: STAFF,
  produces: CSV,
  run: async ({ ctx }) => {
    const csv = await exportOffersCsv(db, ctx);
    const day = now().toISOString().slice(0, 10);
    return new Response(`\ufeff${csv}`, {
      headers: {
        'Content-Type': 'text/csv; charset=utf-8',
        'Content-Disposition': `attachment; filename="offers-${day}.csv"`,
        'Cache-Control': 'no-store',
      },
    });
  },
});
