import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { paymentsDeps } from '@/lib/payments/client';
import { startCardSale } from '@/lib/sales/card';
import { startSaleInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary: 'A basket paid by card: answers the processor’s pay-page URL for the browser to go to',
  who: ['member', 'steward'],
  body: json(startSaleInput),
  status: 201,
  response: z.object({
    sale: z.object({
      id: z.string(),
      status: z.literal('pending'),
      totalMinor: z.number().int(),
      currency: z.string(),
      expiresAt: z.unknown(),
    }),
    url: z.string(),
  }),
  run: async ({ ctx, body }) => {
    const started = await startCardSale(db, ctx, body, paymentsDeps(ctx.spaceId));
    return {
      sale: {
        id: started.saleId,
        status: 'pending',
        totalMinor: started.totalMinor,
        currency: started.currency,
        expiresAt: started.expiresAt,
      },
      url: started.url,
    };
  },
});
