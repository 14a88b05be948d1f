import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import type { Sale } from '@/db/types';
import { acceptPayment } from '@/lib/sales/accept';
import { markSaleEnded } from '@/lib/sales/paid';
import { recordRefusedPayment } from '@/lib/sales/refused';
import { applyRefund, lockSale, parseRefundMetadata, refundsOfSale } from '@/lib/sales/refunds';
import { applyDepositEvent, ourDeposit } from '@/lib/deposits/events';
import { applyChargePaymentEvent, ourChargePayment, refuseClaimedChargePayment } from '@/lib/charges/card-events';

export type EventOutcome = {
  outcome: string;
  /** Sales that became paid in this event: their receipts go out after the commit. */
  receipts: string[];
  /** Sales whose refunds the processor is ahead on: fetch their refunds after the commit. */
  refundsToSync: string[];
  /** Deposits whose release is fixed: the refund goes to the processor after the commit. */
  depositsToRelease?: { spaceId: string; depositId: string }[];
  /** Card payments of charges that became paid: their receipts go out after the commit. */
  chargeReceipts?: { spaceId: string; paymentId: string }[];
};

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const asUuid = (v: unknown) => (typeof v === 'string' && UUID.test(v) ? v : null);
const idOf = (v: unknown) =>
  typeof v === 'string'
    ? v
    : v && typeof v === 'object' && 'id' in v
      ? String((v as { id: string }).id)
      : null;

type Obj = {
  id?: string;
  metadata?: Record<string, string> | null;
  client_reference_id?: string | null;
  payment_intent?: unknown;
  amount?: number | null;
  amount_total?: number | null;
  currency?: string | null;
};

/**
 * The sale an event is about, found only through ids Ohmstead stored itself: the checkout session it
 * opened for the sale, or the payment intent of a payment it already accepted. The sale id in the
 * event's metadata is never enough: anyone who can open a session at the processor can write it.
 */
async function ourSale(trx: Db, event: Stripe.Event, obj: Obj): Promise<Sale | undefined> {
  // across spaces: the event names no space we trust; the stored session or payment id finds the sale.
  const q = trx.selectFrom('sales').selectAll().where('reverses_sale_id', 'is', null);
  if (event.type.startsWith('checkout.session.'))
    return obj.id ? q.where('checkout_session_id', '=', obj.id).executeTakeFirst() : undefined;
  const pi = event.type.startsWith('payment_intent.') ? (obj.id ?? null) : idOf(obj.payment_intent);
  return pi ? q.where('payment_intent_id', '=', pi).executeTakeFirst() : undefined;
}

/** The sale the event's metadata names, when it is not ours by stored id: only ever reported, never changed. */
async function claimedSale(trx: Db, obj: Obj): Promise<Pick<Sale, 'id' | 'space_id' | 'status'> | undefined> {
  const id = asUuid(obj.metadata?.saleId) ?? asUuid(obj.client_reference_id);
  if (!id) return undefined;
  // across spaces: a claim is only reported (in the space of the sale it names), never acted on.
  return trx
    .selectFrom('sales')
    .select(['id', 'space_id', 'status'])
    .where('id', '=', id)
    .where('reverses_sale_id', 'is', null)
    .executeTakeFirst();
}

async function knownSpace(trx: Db, id: string | null): Promise<string | null> {
  if (!id) return null;
  const s = await trx.selectFrom('spaces').select('id').where('id', '=', id).executeTakeFirst();
  return s?.id ?? null;
}

const done = (outcome: string, extra: Partial<EventOutcome> = {}): EventOutcome => ({
  outcome,
  receipts: [],
  refundsToSync: [],
  ...extra,
});

type Found = {
  event: Stripe.Event;
  obj: Obj;
  /** Ours by a stored id. */
  sale: Sale | undefined;
  /** Named in the metadata only. */
  claimed: Pick<Sale, 'id' | 'space_id' | 'status'> | undefined;
};

/**
 * Applies one verified processor event, once. The event id goes into payment_events first (its
 * primary key): a second delivery finds it there and changes nothing, and concurrent deliveries of the
 * same event wait on that key until the first commits. Every guard below is a status transition that
 * can only happen once (pending → paid, pending → expired), so events arriving out of order cannot
 * undo a payment. All of it is one transaction.
 */
export async function applyPaymentEvent(db: Db, event: Stripe.Event): Promise<EventOutcome> {
  const obj = event.data.object as unknown as Obj;
  return db.transaction().execute(async (trx) => {
    // A loan's deposit is found the same way as a sale: by the processor ids stored on it.
    const deposit = await ourDeposit(trx, event);
    // A card payment of charges likewise (lib/charges/card-events.ts).
    const chargePayment = deposit ? undefined : await ourChargePayment(trx, event);
    const sale = deposit || chargePayment ? undefined : await ourSale(trx, event, obj);
    const claimed = sale || deposit || chargePayment ? undefined : await claimedSale(trx, obj);
    const spaceId =
      deposit?.space_id ??
      chargePayment?.space_id ??
      sale?.space_id ??
      claimed?.space_id ??
      (await knownSpace(trx, asUuid(obj.metadata?.spaceId)));
    // across spaces: every delivery is kept once, also those naming no space of ours (space_id null).
    const inserted = await trx
      .insertInto('payment_events')
      .values({
        id: event.id,
        type: event.type,
        space_id: spaceId,
        object_id: obj.id ?? null,
        created: new Date(event.created * 1000),
        payload: JSON.stringify(event),
        outcome: 'received',
      })
      .onConflict((oc) => oc.column('id').doNothing())
      .returning('id')
      .executeTakeFirst();
    if (!inserted) return done('duplicate delivery: already applied');

    const claimedPayment = deposit || chargePayment || sale || claimed ? null : await refuseClaimedChargePayment(trx, event);
    const result = deposit
      ? { receipts: [], refundsToSync: [], ...(await applyDepositEvent(trx, deposit, event)) }
      : chargePayment
        ? { receipts: [], refundsToSync: [], ...(await applyChargePaymentEvent(trx, chargePayment, event)) }
        : claimedPayment
          ? done(claimedPayment)
          : await dispatch(trx, { event, obj, sale, claimed });
    // across spaces: the row inserted just above, by its processor id.
    await trx
      .updateTable('payment_events')
      .set({ outcome: result.outcome })
      .where('id', '=', event.id)
      .execute();
    return result;
  });
}

/** An event that names one of our sales without being its own: nothing changes; the treasurer is told. */
async function refuse(trx: Db, f: Found, why: string): Promise<EventOutcome> {
  await recordRefusedPayment(trx, {
    spaceId: f.claimed!.space_id,
    saleId: f.claimed!.id,
    type: f.event.type,
    eventId: f.event.id,
    objectId: f.obj.id ?? null,
    amountMinor: f.obj.amount_total ?? f.obj.amount ?? null,
    currency: f.obj.currency ?? null,
    why,
  });
  return done(`refused: ${why}`);
}

const notOurSession = (f: Found) =>
  `checkout session ${f.obj.id ?? '(none)'} is not the one Ohmstead opened for sale ${f.claimed!.id}`;

async function dispatch(trx: Db, f: Found): Promise<EventOutcome> {
  const { event, sale, claimed } = f;
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object;
      if (!sale) return claimed ? refuse(trx, f, notOurSession(f)) : done('no matching sale');
      if (session.payment_status !== 'paid') return done('session complete, payment not yet paid');
      const out = await acceptPayment(trx, sale, {
        sessionId: session.id,
        paymentIntentId: idOf(session.payment_intent),
        amountMinor: session.amount_total,
        currency: session.currency,
        paidAt: new Date(event.created * 1000),
        source: event.id,
        type: event.type,
        eventId: event.id,
      });
      if ('refused' in out) return done(`refused: ${out.refused}`);
      return out.changed
        ? done('sale paid', { receipts: [sale.id] })
        : done(`no change: sale already ${out.sale?.status}`);
    }
    case 'payment_intent.succeeded':
    case 'payment_intent.payment_failed':
    case 'payment_intent.canceled': {
      // A payment intent is tied to our sale only once the sale's own checkout session reports it as
      // paid; until then its session's events decide (a declined card leaves the session open for
      // another try; the session's expiry ends the sale).
      if (sale) return done(`no change: sale already ${sale.status}`);
      if (claimed)
        return done(
          `no change: ${event.type} names sale ${claimed.id} (${claimed.status}); its checkout session decides`,
        );
      return done('no matching sale');
    }
    case 'checkout.session.expired':
    case 'checkout.session.async_payment_failed': {
      if (!sale) return claimed ? refuse(trx, f, notOurSession(f)) : done('no matching sale');
      const status = event.type === 'checkout.session.expired' ? 'expired' : 'failed';
      const changed = await markSaleEnded(trx, sale.id, status, { source: event.id });
      return done(changed ? `sale ${status}` : `no change: sale already ${sale.status}`);
    }
    case 'refund.created':
    case 'refund.updated':
    case 'charge.refund.updated': {
      const refund = event.data.object as Stripe.Refund;
      if (refund.status !== 'succeeded' && refund.status !== 'pending')
        return done(`refund ${refund.status}: nothing to book`);
      if (!sale)
        return claimed
          ? refuse(
              trx,
              f,
              `refund ${refund.id} is not of the payment Ohmstead accepted for sale ${claimed.id}`,
            )
          : done('no matching sale');
      return done(await bookProcessorRefund(trx, sale, refund, event.id));
    }
    case 'charge.refunded': {
      const charge = event.data.object;
      if (!sale)
        return claimed
          ? refuse(trx, f, `charge ${charge.id} is not the payment Ohmstead accepted for sale ${claimed.id}`)
          : done('no matching sale');
      const booked = await refundsOfSale(trx, sale)
        .select((eb) => eb.fn.coalesce(eb.fn.sum<number>('amount_minor'), eb.lit(0)).as('n'))
        .where('processor_refund_id', 'is not', null)
        .executeTakeFirstOrThrow();
      return Number(booked.n) >= charge.amount_refunded
        ? done('refunds already booked')
        : done('processor ahead on refunds: fetching them', { refundsToSync: [sale.id] });
    }
    default:
      return done('ignored: not an event we act on');
  }
}

/** Books a processor refund on its sale (our own refunds carry their lines in the metadata). */
export async function bookProcessorRefund(
  trx: Db,
  sale: Pick<Sale, 'id' | 'space_id'>,
  refund: Stripe.Refund,
  source: string,
): Promise<string> {
  const locked = await lockSale(trx, sale.space_id, sale.id);
  if (!['paid', 'partially_refunded', 'refunded'].includes(locked.status)) {
    // The refund of a sale we do not yet hold as paid: the reconciliation shows it for the treasurer.
    return `refund not booked: sale is ${locked.status} on our side`;
  }
  const md = parseRefundMetadata(refund.metadata);
  const actor = md.by
    ? await trx.selectFrom('users').select('id').where('id', '=', md.by).executeTakeFirst()
    : undefined;
  const out = await applyRefund(trx, locked, {
    processorRefundId: refund.id,
    amountMinor: refund.amount,
    lines: md.lines,
    restock: md.restock,
    actorId: actor?.id ?? null,
    source,
  });
  return out.applied ? 'refund booked' : 'refund already booked';
}
