import 'server-only';
import type Stripe from 'stripe';
import type { Selectable } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { ChargePaymentsTable } from '@/db/types';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { refuseUnlessOwnSession } from '@/lib/sales/accept';
import { recordRefusedPayment } from '@/lib/sales/refused';
import { applyToCharges } from './apply';

// The processor's events about a card payment of charges, under the sales' rules: the payment is found
// only by the checkout session (or payment intent) Ohmstead stored on it, and it counts only for its
// exact amount and currency (paymentMismatch, the sales' own check). A session merely *claiming* one of
// our payments in its metadata changes nothing and goes on the treasurer's list. Each change is a
// guarded status update, so a duplicate delivery settles nothing twice. lib/payments/events.ts calls this
// inside its transaction, after writing the event id down once.

export type ChargePayment = Selectable<ChargePaymentsTable>;
export type ChargePaymentOutcome = { outcome: string; chargeReceipts: { spaceId: string; paymentId: string }[] };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const idOf = (v: unknown) =>
  typeof v === 'string' ? v : v && typeof v === 'object' && 'id' in v ? String((v as { id: string }).id) : null;
const done = (outcome: string, chargeReceipts: ChargePaymentOutcome['chargeReceipts'] = []): ChargePaymentOutcome => ({
  outcome,
  chargeReceipts,
});

/** The charge payment an event is about, by the session or payment intent stored on it. */
export async function ourChargePayment(trx: Db, event: Stripe.Event): Promise<ChargePayment | undefined> {
  const obj = event.data.object as { id?: string; payment_intent?: unknown };
  // across spaces: the event names no space we trust; the stored session or payment id finds the payment.
  const q = trx.selectFrom('charge_payments').selectAll();
  if (event.type.startsWith('checkout.session.'))
    return obj.id ? q.where('checkout_session_id', '=', obj.id).forUpdate().executeTakeFirst() : undefined;
  const pi = event.type.startsWith('payment_intent.') ? (obj.id ?? null) : idOf(obj.payment_intent);
  return pi ? q.where('payment_intent_id', '=', pi).forUpdate().executeTakeFirst() : undefined;
}

/** An event whose metadata names one of our charge payments without being its session: reported, never applied. */
export async function refuseClaimedChargePayment(trx: Db, event: Stripe.Event): Promise<string | null> {
  const obj = event.data.object as { id?: string; metadata?: Record<string, string> | null; amount_total?: number | null; currency?: string | null };
  const claimed = obj.metadata?.chargePaymentId;
  if (!event.type.startsWith('checkout.session.') || !claimed || !UUID.test(claimed)) return null;
  // across spaces: a claim is only reported, in the space of the payment it names.
  const p = await trx.selectFrom('charge_payments').select(['id', 'space_id']).where('id', '=', claimed).executeTakeFirst();
  if (!p) return null;
  const why = `checkout session ${obj.id ?? '(none)'} is not the one Ohmstead opened for charge payment ${p.id}`;
  await recordRefusedPayment(trx, {
    spaceId: p.space_id,
    saleId: null,
    type: event.type,
    eventId: event.id,
    objectId: obj.id ?? null,
    amountMinor: obj.amount_total ?? null,
    currency: obj.currency ?? null,
    why,
  });
  return `refused: ${why}`;
}

export async function applyChargePaymentEvent(trx: Db, p: ChargePayment, event: Stripe.Event): Promise<ChargePaymentOutcome> {
  const space = { spaceId: p.space_id };
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object as Stripe.Checkout.Session;
      if (session.payment_status !== 'paid') return done('charge payment: session complete, not yet paid');
      const why = await refuseUnlessOwnSession(
        trx,
        { id: p.id, spaceId: p.space_id, what: 'charge payment', checkout_session_id: p.checkout_session_id, total_minor: p.amount_minor, currency: p.currency },
        event,
        session,
      );
      if (why) return done(`refused: ${why}`);
      // A page closed by us (what was owed changed) but paid before it closed still counts: money came in.
      const paid = await scoped(trx, space)
        .updateTable('charge_payments')
        .set({ status: 'paid', payment_intent_id: idOf(session.payment_intent), paid_at: new Date(event.created * 1000) })
        .where('id', '=', p.id)
        .where('status', 'in', ['pending', 'ended'])
        .returning('id')
        .executeTakeFirst();
      if (!paid) return done(`charge payment: no change (already ${p.status})`);
      const applied = await applyToCharges(trx, p.space_id, p.user_id, p.amount_minor);
      const surplus = p.amount_minor - applied.appliedMinor;
      if (surplus > 0)
        // Cash was recorded while the page was open: the treasurer gives the rest back by hand.
        await recordRefusedPayment(trx, {
          spaceId: p.space_id,
          saleId: null,
          type: event.type,
          eventId: event.id,
          objectId: session.id,
          amountMinor: surplus,
          currency: p.currency,
          why: `charge payment ${p.id} paid ${surplus} (minor units) more than was owed by then; give it back`,
        });
      await audit(trx, {
        spaceId: p.space_id,
        actorId: null,
        action: 'charge.settled',
        targetType: 'user',
        targetId: p.user_id,
        detail: {
          method: 'card',
          paymentId: p.id,
          amountMinor: p.amount_minor,
          appliedMinor: applied.appliedMinor,
          currency: p.currency,
          charges: applied.charges,
          event: event.id,
        },
      });
      return done('charge payment paid', [{ spaceId: p.space_id, paymentId: p.id }]);
    }
    case 'checkout.session.expired':
    case 'checkout.session.async_payment_failed': {
      const ended = await scoped(trx, space)
        .updateTable('charge_payments')
        .set({ status: 'ended', ended_at: now() })
        .where('id', '=', p.id)
        .where('status', '=', 'pending')
        .returning('id')
        .executeTakeFirst();
      return done(ended ? 'charge payment: pay page closed unpaid' : `charge payment: no change (already ${p.status})`);
    }
    default:
      return done('charge payment: nothing to do for this event');
  }
}
