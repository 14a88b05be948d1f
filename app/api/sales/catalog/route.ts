import { z } from 'zod';
import { db } from '@/db';
import { route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { sellableCatalog } from '@/lib/sales/catalog';
import { spaceClock } from '@/lib/sales/periods';

export const dynamic = 'force-dynamic';

export const GET = route({
  method: 'GET',
  summary: 'What the counter sells, with prices and what is on the shelf now',
  who: ['member', 'steward'],
  response: z.object({ currency: z.string(), items: z.array(record('A sellable item.')) }),
  run: async ({ ctx }) => {
    const { currency } = await spaceClock(db, ctx.spaceId);
    return { currency, items: await sellableCatalog(db, ctx.spaceId) };
  },
});
