import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Sale } from '@/db/types';
import { markSalePaid, type PaidOutcome } from './paid';
import { recordRefusedPayment } from './refused';

// The gate in front of markSalePaid for money the processor reports (webhook events, status checks,
// the sweep). Anyone who can open a checkout session at the processor can write our sale's id into its
// metadata, so the sale is paid only by the session Ohmstead itself opened for it (the id stored on the
// sale when it was opened) and only for the sale's exact amount and currency. Anything else changes
// nothing and is written down for the treasurer.

export type PaymentEvidence = {
  /** The checkout session the money was paid through. */
  sessionId: string | null;
  paymentIntentId: string | null;
  amountMinor: number | null;
  currency: string | null;
  /** When the processor took the money; defaults to now. */
  paidAt?: Date;
  /** What told us: an event id, 'status check', 'sweep'. */
  source: string;
  /** The event type, or the same words as `source` for a question we asked. */
  type: string;
  eventId: string | null;
};

export type SaleMoney = Pick<Sale, 'id' | 'space_id' | 'checkout_session_id' | 'total_minor' | 'currency'>;

export type AcceptOutcome = PaidOutcome | { changed: false; refused: string; sale: Sale | null };

/** Why the reported money is not this sale's payment, or null when it is. */
export function paymentMismatch(
  sale: Pick<SaleMoney, 'checkout_session_id' | 'total_minor' | 'currency'>,
  ev: Pick<PaymentEvidence, 'sessionId' | 'amountMinor' | 'currency'>,
  /** What was paid for, in the reason's words (a charge payment uses the same rule). */
  what = 'sale',
): string | null {
  if (!sale.checkout_session_id || ev.sessionId !== sale.checkout_session_id)
    return `checkout session ${ev.sessionId ?? '(none)'} is not the one Ohmstead opened for this ${what}`;
  if (ev.amountMinor !== sale.total_minor)
    return `the processor's amount (${ev.amountMinor ?? 'none'}) is not the ${what}'s (${sale.total_minor}), in minor units`;
  const theirs = ev.currency?.trim().toUpperCase();
  if (theirs !== sale.currency.trim().toUpperCase())
    return `the processor's currency (${theirs ?? 'none'}) is not the ${what}'s (${sale.currency.trim()})`;
  return null;
}

/**
 * A completed checkout session for something other than a sale (a deposit, a payment of charges), judged by
 * the same rule: the reason it is not that payment's own, recorded for the treasurer once, or null. In the
 * caller's transaction.
 */
export async function refuseUnlessOwnSession(
  trx: Db,
  own: { id: string; spaceId: string; what: string } & Pick<SaleMoney, 'checkout_session_id' | 'total_minor' | 'currency'>,
  event: Stripe.Event,
  session: Stripe.Checkout.Session,
): Promise<string | null> {
  const why = paymentMismatch(
    own,
    { sessionId: session.id, amountMinor: session.amount_total, currency: session.currency },
    own.what,
  );
  if (why)
    await recordRefusedPayment(trx, {
      spaceId: own.spaceId,
      saleId: null,
      type: event.type,
      eventId: event.id,
      objectId: session.id,
      amountMinor: session.amount_total,
      currency: session.currency,
      why: `${own.what} ${own.id}: ${why}`,
    });
  return why;
}

/** Pays the sale when the evidence is its own payment; otherwise records the refusal. In the caller's transaction. */
export async function acceptPayment(trx: Db, sale: SaleMoney, ev: PaymentEvidence): Promise<AcceptOutcome> {
  const why = paymentMismatch(sale, ev);
  if (why) {
    await recordRefusedPayment(trx, {
      spaceId: sale.space_id,
      saleId: sale.id,
      type: ev.type,
      eventId: ev.eventId,
      objectId: ev.sessionId,
      amountMinor: ev.amountMinor,
      currency: ev.currency,
      why,
    });
    const current = await scoped(trx, { spaceId: sale.space_id }).selectFrom('sales').selectAll().where('id', '=', sale.id).executeTakeFirst();
    return { changed: false, refused: why, sale: current ?? null };
  }
  return markSalePaid(trx, {
    saleId: sale.id,
    paymentIntentId: ev.paymentIntentId,
    amountMinor: ev.amountMinor,
    currency: ev.currency,
    paidAt: ev.paidAt,
    source: ev.source,
  });
}
