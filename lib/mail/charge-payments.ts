import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { owedBy } from '@/lib/charges/owed';
import { log } from '@/lib/log';
import { formatMoney } from '@/lib/money';
import { sendMail } from './server';

// The receipt for charges paid by card, after the webhook's commit: what was paid and what is still owed.
// A mail failure is logged, never turned into a failed webhook.

export function chargePaymentReceipt(n: { name: string; spaceName: string; paidMinor: number; owedMinor: number; currency: string }) {
  const money = (x: number) => formatMoney(x, n.currency);
  return {
    subject: `Paid at ${n.spaceName}: ${money(n.paidMinor)} towards your charges`,
    text:
      `Hello ${n.name},\n\nThank you: ${money(n.paidMinor)} paid by card towards what you owed at ${n.spaceName}.\n` +
      (n.owedMinor > 0 ? `Still owed: ${money(n.owedMinor)}.\n` : 'Nothing more is owed.\n'),
  };
}

export async function sendChargePaymentReceipts(db: Db, paid: { spaceId: string; paymentId: string }[]): Promise<void> {
  for (const p of paid) {
    try {
      const row = await scoped(db, { spaceId: p.spaceId })
        .selectFrom('charge_payments')
        .innerJoin('users', 'users.id', 'charge_payments.user_id')
        .innerJoin('spaces', 'spaces.id', 'charge_payments.space_id')
        .select(['users.id as userId', 'users.name', 'users.email', 'spaces.name as spaceName', 'charge_payments.amount_minor', 'charge_payments.currency'])
        .where('charge_payments.id', '=', p.paymentId)
        .executeTakeFirstOrThrow();
      const owedMinor = await owedBy(db, p.spaceId, row.userId);
      await sendMail({
        to: row.email,
        ...chargePaymentReceipt({ name: row.name, spaceName: row.spaceName, paidMinor: row.amount_minor, owedMinor, currency: row.currency }),
      });
    } catch (err) {
      log.error({ paymentId: p.paymentId, err: err instanceof Error ? err.message : String(err) }, 'charge payment receipt not sent');
    }
  }
}
