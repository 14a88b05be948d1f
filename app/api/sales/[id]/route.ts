import { db } from '@/db';
import { now } from '@/lib/clock';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { saleFor } from '@/lib/sales/access';
import { isProcessorUnreachable } from '@/lib/sales/processor-errors';
import { saleView } from '@/lib/sales/read';
import { settleSale } from '@/lib/sales/settle';

export const dynamic = 'force-dynamic';

// A pending sale past its expiry is settled with the processor on the way, so the page never waits on
// a sale nobody can pay any more.
export const GET = route({
  method: 'GET',
  summary: 'One sale (the counter’s status page polls this)',
  who: 'signed-in',
  params: idParams,
  notFound: 'sale',
  response: one('sale', 'The sale with its lines and status.'),
  run: async ({ ctx, params }) => {
    const sale = await saleFor(db, ctx, params.id);
    if (sale.status === 'pending' && sale.method === 'card' && sale.expires_at && sale.expires_at < now()) {
      try {
        const settled = await settleSale(db, paymentsClient(ctx.spaceId), sale, {
          expireOpen: true,
          source: 'status check',
        });
        if (settled.receipt) await sendReceipts(db, [sale.id]);
      } catch (err) {
        if (!isProcessorUnreachable(err)) throw err; // unreachable: show it pending; the sweep asks again
      }
    }
    return { sale: await saleView(db, ctx, params.id) };
  },
});
