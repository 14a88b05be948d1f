import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Sale } from '@/db/types';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { isClosedAt } from './periods';
import { takeStock, type Shortfall } from './stock';

export type PaidInfo = {
  saleId: string;
  paymentIntentId: string | null;
  /** What the processor says it charged, to compare with what the sale says. */
  amountMinor: number | null;
  currency: string | null;
  /** When the processor took the money (its event time); defaults to now. */
  paidAt?: Date;
  /** What told us: an event id, 'sweep', 'seed'. */
  source: string;
  /** Date the stock movements at the payment time (demo data written after the fact); default now. */
  backdate?: boolean;
};

export type PaidOutcome =
  { changed: false; sale: Sale | null } | { changed: true; sale: Sale; short: Shortfall[] };

/**
 * The one way a card sale becomes paid. A single guarded UPDATE flips it, so however many deliveries
 * of however many events race here, exactly one transaction moves the stock. Money wins: a sale the
 * processor says is paid becomes paid even if an earlier event had marked it failed or expired. A
 * short shelf never refuses money already received: the sale is paid and the shortfall is flagged in
 * the audit for the steward. Run inside the caller's transaction.
 */
export async function markSalePaid(trx: Db, info: PaidInfo): Promise<PaidOutcome> {
  let paidAt = info.paidAt ?? now();
  // across spaces: the caller found this sale by the processor's ids Ohmstead stored (lib/sales/accept.ts).
  const current = await trx.selectFrom('sales').selectAll().where('id', '=', info.saleId).executeTakeFirst();
  if (!current) return { changed: false, sale: null };
  const inSpace = scoped(trx, { spaceId: current.space_id });
  // A closed month never changes: a late payment lands in today's (open) month instead.
  const closedMonth = await isClosedAt(trx, current.space_id, paidAt);
  if (closedMonth) paidAt = now();

  const sale = await inSpace
    .updateTable('sales')
    .set({ status: 'paid', paid_at: paidAt, payment_intent_id: info.paymentIntentId })
    .where('id', '=', info.saleId)
    .where('method', '=', 'card')
    .where('status', 'in', ['pending', 'failed', 'expired'])
    .returningAll()
    .executeTakeFirst();
  if (!sale) {
    // Another delivery got here first (its transaction held the row); report the state it left.
    const latest = await inSpace.selectFrom('sales').selectAll().where('id', '=', info.saleId).executeTakeFirst();
    return { changed: false, sale: latest ?? current };
  }

  const lines = await inSpace
    .selectFrom('sale_lines')
    .select(['id', 'part_id', 'qty'])
    .where('sale_id', '=', sale.id)
    .execute();
  const short = await takeStock(trx, {
    spaceId: sale.space_id,
    saleId: sale.id,
    actorId: null,
    lines,
    allowShort: true,
    ...(info.backdate ? { at: paidAt } : {}),
  });

  const base = { spaceId: sale.space_id, actorId: null, targetType: 'sale', targetId: sale.id };
  await audit(trx, {
    ...base,
    action: 'sale.paid',
    detail: { source: info.source, totalMinor: sale.total_minor, was: current.status },
  });
  if (closedMonth)
    await audit(trx, {
      ...base,
      action: 'sale.paid_after_close',
      detail: { processorTime: info.paidAt?.toISOString() },
    });
  const sameCurrency = !info.currency || info.currency.toUpperCase() === sale.currency.trim().toUpperCase();
  if ((info.amountMinor !== null && info.amountMinor !== sale.total_minor) || !sameCurrency) {
    await audit(trx, {
      ...base,
      action: 'sale.amount_differs',
      detail: {
        ours: sale.total_minor,
        theirs: info.amountMinor,
        currency: info.currency,
        source: info.source,
      },
    });
  }
  if (short.length)
    await audit(trx, {
      ...base,
      action: 'sale.stock_short',
      detail: { lines: short, note: 'paid; shelf count needs a look' },
    });
  return { changed: true, sale, short };
}

/**
 * A card sale that will not be paid (session expired, card declined, processor unreachable). Only a
 * pending sale changes: an event arriving after the payment can never undo it.
 */
export async function markSaleEnded(
  trx: Db,
  saleId: string,
  status: 'expired' | 'failed',
  why: { source: string; actorId?: string | null; reason?: string },
): Promise<boolean> {
  // across spaces: called by the webhook and the sweeps with the sale they found (by stored ids, per space).
  const sale = await trx
    .updateTable('sales')
    .set({ status })
    .where('id', '=', saleId)
    .where('status', '=', 'pending')
    .returning(['id', 'space_id'])
    .executeTakeFirst();
  if (!sale) return false;
  await audit(trx, {
    spaceId: sale.space_id,
    actorId: why.actorId ?? null,
    action: `sale.${status}`,
    targetType: 'sale',
    targetId: sale.id,
    detail: { source: why.source, ...(why.reason ? { reason: why.reason } : {}) },
  });
  return true;
}
