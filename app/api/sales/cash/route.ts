import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { sendReceipts } from '@/lib/mail/sales';
import { recordCashSale } from '@/lib/sales/cash';
import { startSaleInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary: 'Cash into the honour box, recorded by a steward: paid at once, stock out',
  who: ['steward'],
  body: json(startSaleInput),
  status: 201,
  response: z.object({
    sale: z.object({ id: z.string(), status: z.literal('paid'), totalMinor: z.number().int(), currency: z.string() }),
  }),
  run: async ({ ctx, body }) => {
    const sale = await recordCashSale(db, ctx, body);
    await sendReceipts(db, [sale.saleId]);
    return { sale: { id: sale.saleId, status: 'paid', totalMinor: sale.totalMinor, currency: sale.currency } };
  },
});
