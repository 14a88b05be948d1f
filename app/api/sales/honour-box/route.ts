import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { sendReceipts } from '@/lib/mail/sales';
import { recordCashSale } from '@/lib/sales/cash';
import { honourBoxSaleInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary: 'A member records their own cash purchase into the honour box: they are the buyer; paid at once, stock out',
  who: ['member', 'steward'],
  body: json(honourBoxSaleInput),
  status: 201,
  response: z.object({
    sale: z.object({
      id: z.string(),
      status: z.literal('paid'),
      totalMinor: z.number().int(),
      taxMinor: z.number().int(),
      currency: z.string(),
    }),
  }),
  run: async ({ ctx, body }) => {
    const sale = await recordCashSale(db, ctx, body, 'honour_box');
    await sendReceipts(db, [sale.saleId]);
    return {
      sale: { id: sale.saleId, status: 'paid', totalMinor: sale.totalMinor, taxMinor: sale.taxMinor, currency: sale.currency },
    };
  },
});
