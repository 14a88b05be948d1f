import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { bookProcessorRefund } from './events';

/**
 * When the processor reports more refunded on a charge than we have booked (a refund event lost, or
 * a refund made on the processor's side), fetch the payment's refunds and book the missing ones.
 */
export async function syncRefunds(db: Db, stripe: Stripe, saleId: string): Promise<number> {
  // across spaces: the sale id comes from the webhook's own lookup (lib/payments/events.ts).
  const sale = await db
    .selectFrom('sales')
    .select(['id', 'space_id', 'payment_intent_id'])
    .where('id', '=', saleId)
    .executeTakeFirst();
  if (!sale?.payment_intent_id) return 0;
  const refunds = await stripe.refunds
    .list({ payment_intent: sale.payment_intent_id, limit: 100 })
    .autoPagingToArray({ limit: 1000 });
  let booked = 0;
  for (const refund of refunds) {
    if (refund.status !== 'succeeded' && refund.status !== 'pending') continue;
    const outcome = await db
      .transaction()
      .execute((trx) => bookProcessorRefund(trx, sale, refund, 'refund sync'));
    if (outcome === 'refund booked') booked += 1;
  }
  return booked;
}
