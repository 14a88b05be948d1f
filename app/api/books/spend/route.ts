import { z } from 'zod';
import { db } from '@/db';
import { route } from '@/lib/http/route';
import { CSV } from '@/lib/http/shapes';
import { monthForBooks } from '@/lib/reconcile/run';
import { spendExport } from '@/lib/restock/spend-export';
import { monthInput } from '@/lib/sales/schemas';

export const dynamic = 'force-dynamic';

// Prices paid and suppliers are for treasurers and admins only (members never see them).
export const GET = route({
  method: 'GET',
  summary:
    'The month’s restocking spend as a CSV download (?month=YYYY-MM): one row per line received against an order list, at the price paid, in minor units, times in the space’s zone with their offset',
  who: ['treasurer', 'admin'],
  query: z.object({ month: monthInput.optional() }),
  produces: CSV,
  run: async ({ ctx, query }) => {
    const month = await monthForBooks(ctx, query.month);
    return new Response(await spendExport(db, ctx, month), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="ohmstead-spend-${month}.csv"`,
        'cache-control': 'no-store',
      },
    });
  },
});
