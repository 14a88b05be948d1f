import { z } from 'zod';
import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { cancelCardSale } from '@/lib/sales/card';
import { processorError } from '@/lib/sales/processor-errors';

export const POST = route({
  method: 'POST',
  summary: 'The buyer turned back on the pay page: ends the card sale now',
  who: ['member', 'steward'],
  params: idParams,
  notFound: 'sale',
  response: z.object({ sale: z.object({ id: z.string(), status: z.string() }) }),
  run: async ({ ctx, params }) => {
    const settled = await cancelCardSale(db, ctx, params.id, paymentsClient(ctx.spaceId)).catch((err: unknown) => {
      throw processorError(err, 'cancel the card payment');
    });
    if (settled.receipt) await sendReceipts(db, [params.id]);
    return { sale: { id: params.id, status: settled.status } };
  },
});
