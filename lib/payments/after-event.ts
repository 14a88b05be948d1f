import 'server-only';
import type { Db } from '@/db/connect';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from './client';
import { syncRefunds } from './refund-sync';
import { log } from '@/lib/log';
import { sendRelease } from '@/lib/deposits/release';
import { sendChargePaymentReceipts } from '@/lib/mail/charge-payments';

/** What a verified webhook event leaves to do after the answer: receipts, and refunds to fetch. */
export async function afterPaymentEvent(
  db: Db,
  result: { receipts: string[]; refundsToSync: string[]; depositsToRelease?: { spaceId: string; depositId: string }[];
    chargeReceipts?: { spaceId: string; paymentId: string }[];
  },
) {
  await sendReceipts(db, result.receipts);
  await sendChargePaymentReceipts(db, result.chargeReceipts ?? []);
  for (const d of result.depositsToRelease ?? []) await sendRelease(db, paymentsClient(d.spaceId), d.spaceId, d.depositId);
  for (const saleId of result.refundsToSync) {
    // across spaces: the sale ids come from the webhook's own lookup (lib/payments/events.ts).
    const sale = await db.selectFrom('sales').select('space_id').where('id', '=', saleId).executeTakeFirst();
    try {
      if (sale) await syncRefunds(db, paymentsClient(sale.space_id), saleId);
    } catch (err) {
      log.error({ saleId, err: err instanceof Error ? err.message : String(err) }, 'refund sync after webhook failed');
    }
  }
}
