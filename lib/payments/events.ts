import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import type { Sale } from '@/db/types';
import { markSaleEnded, markSalePaid } from '@/lib/sales/paid';
import { applyRefund, lockSale, parseRefundMetadata, refundsOfSale } from '@/lib/sales/refunds';

export type EventOutcome = {
  outcome: string;
  /** Sales that became paid in this event: their receipts go out after the commit. */
  receipts: string[];
  /** Sales whose refunds the processor is ahead on: fetch their refunds after the commit. */
  refundsToSync: string[];
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
};

async function findSale(trx: Db, obj: Obj): Promise<Sale | undefined> {
  const saleId = asUuid(obj.metadata?.saleId) ?? asUuid(obj.client_reference_id);
  if (saleId)
    return trx
      .selectFrom('sales')
      .selectAll()
      .where('id', '=', saleId)
      .where('reverses_sale_id', 'is', null)
      .executeTakeFirst();
  const pi = idOf(obj.payment_intent);
  if (!pi) return undefined;
  return trx
    .selectFrom('sales')
    .selectAll()
    .where('payment_intent_id', '=', pi)
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
    const sale = await findSale(trx, obj);
    const spaceId = sale?.space_id ?? (await knownSpace(trx, asUuid(obj.metadata?.spaceId)));
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

    const result = await dispatch(trx, event, sale);
    await trx
      .updateTable('payment_events')
      .set({ outcome: result.outcome })
      .where('id', '=', event.id)
      .execute();
    return result;
  });
}

async function dispatch(trx: Db, event: Stripe.Event, sale: Sale | undefined): Promise<EventOutcome> {
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object;
      if (session.payment_status !== 'paid') return done('session complete, payment not yet paid');
      return paid(trx, sale, event, {
        pi: idOf(session.payment_intent),
        amount: session.amount_total,
        currency: session.currency,
      });
    }
    case 'payment_intent.succeeded': {
      const pi = event.data.object;
      return paid(trx, sale, event, { pi: pi.id, amount: pi.amount_received, currency: pi.currency });
    }
    case 'checkout.session.expired':
    case 'checkout.session.async_payment_failed':
    case 'payment_intent.payment_failed':
    case 'payment_intent.canceled': {
      if (!sale) return done('no matching sale');
      const status =
        event.type === 'checkout.session.expired' || event.type === 'payment_intent.canceled'
          ? 'expired'
          : 'failed';
      const changed = await markSaleEnded(trx, sale.id, status, { source: event.id });
      return done(changed ? `sale ${status}` : `no change: sale already ${sale.status}`);
    }
    case 'refund.created':
    case 'refund.updated':
    case 'charge.refund.updated': {
      const refund = event.data.object as Stripe.Refund;
      if (refund.status !== 'succeeded' && refund.status !== 'pending')
        return done(`refund ${refund.status}: nothing to book`);
      if (!sale) return done('no matching sale');
      return done(await bookProcessorRefund(trx, sale.id, refund, event.id));
    }
    case 'charge.refunded': {
      const charge = event.data.object;
      if (!sale) return done('no matching sale');
      const booked = await refundsOfSale(trx, sale.id)
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

async function paid(
  trx: Db,
  sale: Sale | undefined,
  event: Stripe.Event,
  money: { pi: string | null; amount: number | null; currency: string | null },
): Promise<EventOutcome> {
  if (!sale) return done('no matching sale');
  const out = await markSalePaid(trx, {
    saleId: sale.id,
    paymentIntentId: money.pi,
    amountMinor: money.amount,
    currency: money.currency,
    paidAt: new Date(event.created * 1000),
    source: event.id,
  });
  return out.changed
    ? done('sale paid', { receipts: [sale.id] })
    : done(`no change: sale already ${out.sale?.status}`);
}

/** Books a processor refund on its sale (our own refunds carry their lines in the metadata). */
export async function bookProcessorRefund(
  trx: Db,
  saleId: string,
  refund: Stripe.Refund,
  source: string,
): Promise<string> {
  const locked = await lockSale(trx, saleId);
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
