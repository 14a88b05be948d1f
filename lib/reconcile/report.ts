import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { monthKey, monthRange, spaceClock, type Month } from '@/lib/sales/periods';
import { refusedPayments, type ToInvestigate } from './investigate';
import { fetchLedger, type TheirTxn } from './ledger';
import { saleRef } from '@/lib/sales/ref';
import { matchPeriod, type OurCharge, type OurDeposit, type OurRefund, type OurSale, type ReconRow, type ReconTotals } from './match';
import { resolutionsOf, type Resolution } from './resolutions';

/** A row as the Books show it: our short sale reference, and the treasurer's note when there is one. */
export type BooksRow = ReconRow & { saleRef: string | null; resolution: Resolution | null };

/** A row that does not match and has no note yet: closing the month with it takes a confirmation. */
export const isUnresolved = (r: BooksRow) => r.status !== 'matched' && !r.resolution;

export type Reconciliation = {
  month: Month;
  from: string;
  to: string;
  timeZone: string;
  currency: string;
  closed: { closedAt: string; closedBy: string | null } | null;
  rows: BooksRow[];
  /** Rows that do not match and carry no resolution note. */
  unresolved: number;
  /** Payments the processor reported that Ohmstead refused to count: the treasurer looks into each. */
  investigate: ToInvestigate[];
  totals: ReconTotals;
  payouts: { id: string | null; amountMinor: number; at: string }[];
  /** The processor's fee entries of the month, one per ledger entry (they sum to totals.processor.feesMinor). */
  fees: { txnId: string; kind: string; at: string; feeMinor: number; saleId: string | null }[];
};

const MARGIN_MS = 24 * 3600_000;
const MONEY_STATES = ['paid', 'partially_refunded', 'refunded'] as const;

/**
 * One month of the books beside the processor's ledger. Our side: card and cash sales with money in
 * the month (by payment time, in the space's time zone) and the refunds booked in it. Their side: the
 * balance transactions of the month (with a day's margin), fetched through the SDK.
 */
export async function reconcileMonth(
  db: Db,
  ctx: Ctx,
  stripe: Stripe,
  month: Month,
): Promise<Reconciliation> {
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  const { from, to } = monthRange(month, timeZone);
  const theirs = await fetchLedger(stripe, {
    from: new Date(from.getTime() - MARGIN_MS),
    to: new Date(to.getTime() + MARGIN_MS),
  });
  const { sales, refunds } = await ourSide(db, ctx.spaceId, from, to, theirs);
  const { deposits, charges } = await ourDepositsAndCharges(db, ctx.spaceId, from, to, theirs);
  const result = matchPeriod({ from, to, spaceId: ctx.spaceId, currency, sales, refunds, deposits, charges, theirs });
  const closed = await scoped(db, ctx)
    .selectFrom('closed_periods')
    .leftJoin('users', 'users.id', 'closed_periods.closed_by')
    .select(['closed_periods.closed_at', 'users.name'])
    .where('closed_periods.space_id', '=', ctx.spaceId)
    .where('closed_periods.month', '=', monthKey(month))
    .executeTakeFirst();
  const notes = await resolutionsOf(
    db,
    ctx.spaceId,
    result.rows.filter((r) => r.status !== 'matched').map((r) => r.key),
  );
  const rows: BooksRow[] = result.rows.map((r) => ({
    ...r,
    saleRef: r.saleId ? saleRef(r.saleId) : null,
    resolution: notes.get(r.key) ?? null,
  }));
  return {
    month,
    from: from.toISOString(),
    to: to.toISOString(),
    timeZone,
    currency,
    closed: closed ? { closedAt: closed.closed_at.toISOString(), closedBy: closed.name } : null,
    rows,
    unresolved: rows.filter(isUnresolved).length,
    investigate: await refusedPayments(db, ctx.spaceId, from, to),
    totals: result.totals,
    fees: result.fees.map((t) => ({
      txnId: t.txnId,
      kind: t.type,
      at: t.created.toISOString(),
      feeMinor: t.feeMinor,
      saleId: t.saleId ?? rows.find((r) => r.txnId === t.txnId)?.saleId ?? null,
    })),
    payouts: result.payouts.map((p) => ({
      id: p.sourceId,
      amountMinor: -p.amountMinor,
      at: p.created.toISOString(),
    })),
  };
}

async function ourSide(
  db: Db,
  spaceId: string,
  from: Date,
  to: Date,
  theirs: TheirTxn[],
): Promise<{ sales: OurSale[]; refunds: OurRefund[] }> {
  const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
  const namedSales = [
    ...new Set(theirs.map((t) => t.saleId).filter((id): id is string => Boolean(id && UUID.test(id)))),
  ];
  const namedPis = [
    ...new Set(theirs.map((t) => t.paymentIntentId).filter((id): id is string => Boolean(id))),
  ];
  const namedRefunds = [
    ...new Set(
      theirs
        .filter((t) => t.type === 'refund')
        .map((t) => t.sourceId)
        .filter((id): id is string => Boolean(id)),
    ),
  ];

  const saleRows = await scoped(db, { spaceId })
    .selectFrom('sales')
    .leftJoin('users', 'users.id', 'sales.buyer_id')
    .select([
      'sales.id',
      'sales.method',
      'sales.status',
      'sales.total_minor',
      'sales.paid_at',
      'sales.payment_intent_id',
      'users.name',
    ])
    .where('sales.space_id', '=', spaceId)
    .where('sales.reverses_sale_id', 'is', null)
    .where((eb) =>
      eb.or([
        eb.and([
          eb('sales.status', 'in', MONEY_STATES),
          eb('sales.paid_at', '>=', from),
          eb('sales.paid_at', '<', to),
        ]),
        ...(namedSales.length ? [eb('sales.id', 'in', namedSales)] : []),
        ...(namedPis.length ? [eb('sales.payment_intent_id', 'in', namedPis)] : []),
      ]),
    )
    .execute();

  const refundRows = await scoped(db, { spaceId })
    .selectFrom('refunds')
    .innerJoin('sales', 'sales.id', 'refunds.sale_id')
    .select([
      'refunds.id',
      'refunds.processor_refund_id',
      'refunds.amount_minor',
      'refunds.created_at',
      'sales.method',
      'sales.id as bookedOn',
      'sales.reverses_sale_id',
    ])
    .where('refunds.space_id', '=', spaceId)
    .where((eb) =>
      eb.or([
        eb.and([eb('refunds.created_at', '>=', from), eb('refunds.created_at', '<', to)]),
        ...(namedRefunds.length ? [eb('refunds.processor_refund_id', 'in', namedRefunds)] : []),
      ]),
    )
    .execute();

  return {
    sales: saleRows.map((s) => ({
      id: s.id,
      method: s.method,
      status: s.status,
      totalMinor: s.total_minor,
      paidAt: s.paid_at,
      paymentIntentId: s.payment_intent_id,
      buyer: s.name,
    })),
    refunds: refundRows.map((r) => ({
      id: r.id,
      saleId: r.reverses_sale_id ?? r.bookedOn,
      method: r.method,
      processorRefundId: r.processor_refund_id,
      amountMinor: r.amount_minor,
      createdAt: r.created_at,
    })),
  };
}

/** Deposits with money in the period (taken or given back), those the ledger names, and the period's charges. */
async function ourDepositsAndCharges(
  db: Db,
  spaceId: string,
  from: Date,
  to: Date,
  theirs: TheirTxn[],
): Promise<{ deposits: OurDeposit[]; charges: OurCharge[] }> {
  const pis = [...new Set(theirs.map((t) => t.paymentIntentId).filter((id): id is string => Boolean(id)))];
  const refundIds = [
    ...new Set(theirs.filter((t) => t.type === 'refund').map((t) => t.sourceId).filter((id): id is string => Boolean(id))),
  ];
  const rows = await scoped(db, { spaceId })
    .selectFrom('deposits')
    .innerJoin('loans', 'loans.id', 'deposits.loan_id')
    .leftJoin('users', 'users.id', 'loans.borrower_id')
    .select([
      'deposits.id',
      'users.name',
      'deposits.amount_minor',
      'deposits.paid_at',
      'deposits.payment_intent_id',
      'deposits.refund_id',
      'deposits.released_minor',
      'deposits.released_at',
    ])
    .where((eb) =>
      eb.or([
        eb.and([eb('deposits.paid_at', '>=', from), eb('deposits.paid_at', '<', to)]),
        eb.and([eb('deposits.released_at', '>=', from), eb('deposits.released_at', '<', to)]),
        ...(pis.length ? [eb('deposits.payment_intent_id', 'in', pis)] : []),
        ...(refundIds.length ? [eb('deposits.refund_id', 'in', refundIds)] : []),
      ]),
    )
    .execute();
  // Card payments of charges are matched by their payment intent, like a deposit taken.
  const cardPayments = await scoped(db, { spaceId })
    .selectFrom('charge_payments')
    .leftJoin('users', 'users.id', 'charge_payments.user_id')
    .select(['charge_payments.id', 'users.name', 'charge_payments.amount_minor', 'charge_payments.paid_at', 'charge_payments.payment_intent_id'])
    .where('charge_payments.method', '=', 'card')
    .where('charge_payments.status', '=', 'paid')
    .where((eb) =>
      eb.or([
        eb.and([eb('charge_payments.paid_at', '>=', from), eb('charge_payments.paid_at', '<', to)]),
        ...(pis.length ? [eb('charge_payments.payment_intent_id', 'in', pis)] : []),
      ]),
    )
    .execute();
  const charges = await scoped(db, { spaceId })
    .selectFrom('charges')
    .select(['amount_minor', 'from_deposit_minor', 'created_at'])
    .where('created_at', '>=', from)
    .where('created_at', '<', to)
    .execute();
  return {
    deposits: rows.map((d) => ({
      id: d.id,
      borrower: d.name,
      amountMinor: d.amount_minor,
      paidAt: d.paid_at,
      paymentIntentId: d.payment_intent_id,
      // A release that kept everything moved no money at the processor: there is no refund to match.
      refundId: d.refund_id,
      releasedMinor: d.released_minor,
      releasedAt: d.released_at,
    })).concat(
      cardPayments.map((p) => ({
        id: p.id,
        borrower: p.name,
        amountMinor: p.amount_minor,
        paidAt: p.paid_at,
        paymentIntentId: p.payment_intent_id,
        refundId: null,
        releasedMinor: null,
        releasedAt: null,
        chargePayment: true as const,
      })),
    ),
    charges: charges.map((c) => ({ amountMinor: c.amount_minor, fromDepositMinor: c.from_deposit_minor, createdAt: c.created_at })),
  };
}
