import 'server-only';
import { db } from '@/db';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { saleFor } from './access';
import { processorError } from './processor-errors';
import { saleView, type SaleView } from './read';
import { settleSale } from './settle';

/**
 * "Check again" on the counter's status page (a POST; reading a sale never changes it). A pending card
 * sale is asked about at the processor through the checkout session Ohmstead opened for it: paid there
 * (for the sale's exact amount) makes it paid here and mails the receipt; a session past its expiry is
 * expired so the sale ends now. Anyone who may see the sale may ask.
 */
export async function checkSaleNow(ctx: Ctx, saleId: string): Promise<SaleView> {
  const sale = await saleFor(db, ctx, saleId);
  if (sale.status === 'pending' && sale.method === 'card') {
    const overdue = Boolean(sale.expires_at && sale.expires_at < now());
    const settled = await settleSale(db, paymentsClient(ctx.spaceId), sale, {
      expireOpen: overdue,
      actorId: ctx.userId,
      source: 'status check',
    }).catch((err: unknown) => {
      throw processorError(err, 'check the payment');
    });
    if (settled.receipt) await sendReceipts(db, [sale.id]);
  }
  return saleView(db, ctx, saleId);
}
