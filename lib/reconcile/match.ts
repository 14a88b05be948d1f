import type { TheirTxn } from './ledger';

// Matching our books against the processor's ledger for one period. Pure: no I/O, so the rules are
// easy to read and to test. A charge matches the sale it names (metadata saleId, else its payment
// intent); a processor refund matches the refund we booked with its id. The ledger is read with a
// day's margin on each side, so a payment taken seconds before midnight whose ledger entry lands
// after midnight still finds its sale; margin entries that match nothing here belong to the
// neighbouring month and are left to it.

export type ReconStatus = 'matched' | 'ours_only' | 'theirs_only' | 'amount_differs';

export type OurSale = {
  id: string;
  method: 'card' | 'cash';
  status: string;
  totalMinor: number;
  paidAt: Date | null;
  paymentIntentId: string | null;
  buyer: string | null;
};

export type OurRefund = {
  id: string;
  saleId: string; // the original sale, even when booked on a reversing entry
  method: 'card' | 'cash';
  processorRefundId: string | null;
  amountMinor: number;
  createdAt: Date;
};

/** A loan's deposit: taken by card (its payment intent) and given back by one refund. */
export type OurDeposit = {
  id: string;
  borrower: string | null;
  amountMinor: number;
  paidAt: Date | null;
  paymentIntentId: string | null;
  refundId: string | null;
  releasedMinor: number | null;
  releasedAt: Date | null;
  /** A card payment of charges (lib/charges/card.ts), matched like a deposit taken, never given back. */
  chargePayment?: true;
};

/** A charge written for a missing or damaged part: how much, and how much of it a deposit covered. */
export type OurCharge = { amountMinor: number; fromDepositMinor: number; createdAt: Date };

export type ReconRow = {
  key: string;
  kind: 'charge' | 'refund';
  status: ReconStatus;
  at: string;
  saleId: string | null;
  refundId: string | null;
  buyer: string | null;
  oursMinor: number | null;
  theirsMinor: number | null;
  differenceMinor: number | null; // theirs − ours
  feeMinor: number | null;
  netMinor: number | null;
  processorId: string | null;
  txnId: string | null;
  note: string;
  /** A loan's deposit (taken, or given back), not a sale. */
  deposit?: true;
  /** With `deposit`: a card payment of charges rather than a deposit. */
  chargePayment?: true;
};

export type ReconTotals = {
  processor: {
    grossMinor: number;
    feesMinor: number;
    refundsMinor: number;
    netMinor: number;
    paidOutMinor: number;
  };
  ours: {
    cardMinor: number;
    cashMinor: number;
    cardRefundsMinor: number;
    cashRefundsMinor: number;
    /** Deposits taken by card in the period, and given back in it (lib/deposits). */
    depositsMinor: number;
    depositReleasesMinor: number;
    /** Charges written in the period, and the part of them kept from deposits. */
    chargesMinor: number;
    chargesFromDepositsMinor: number;
  };
  counts: Record<ReconStatus, number>;
};

const MONEY_STATES = new Set(['paid', 'partially_refunded', 'refunded']);

export function matchPeriod(input: {
  from: Date;
  to: Date;
  spaceId: string;
  currency: string;
  /** Our sales with money in the period, plus any sale the ledger names (from any period). */
  sales: OurSale[];
  /** Our refunds booked in the period, plus any refund the ledger names. */
  refunds: OurRefund[];
  /** Deposits with money in the period, plus any the ledger names. */
  deposits?: OurDeposit[];
  charges?: OurCharge[];
  theirs: TheirTxn[];
}): { rows: ReconRow[]; totals: ReconTotals; payouts: TheirTxn[]; fees: TheirTxn[] } {
  const inPeriod = (d: Date) => d >= input.from && d < input.to;
  const salesById = new Map(input.sales.map((s) => [s.id, s]));
  const salesByPi = new Map(input.sales.filter((s) => s.paymentIntentId).map((s) => [s.paymentIntentId!, s]));
  const refundsByProcessorId = new Map(
    input.refunds.filter((r) => r.processorRefundId).map((r) => [r.processorRefundId!, r]),
  );
  const currency = input.currency.toUpperCase();

  // Whose entry is it? Ours when it names this space or one of our sales or refunds; an entry naming
  // no space at all (made on the processor's side) is shown to every space of its currency.
  const ours = (t: TheirTxn) =>
    t.spaceId === input.spaceId ||
    (t.saleId !== null && salesById.has(t.saleId)) ||
    (t.paymentIntentId !== null && salesByPi.has(t.paymentIntentId)) ||
    (t.sourceId !== null && refundsByProcessorId.has(t.sourceId)) ||
    (t.spaceId === null && t.currency === currency);
  const deposits = input.deposits ?? [];
  const depositsByPi = new Map(deposits.filter((d) => d.paymentIntentId).map((d) => [d.paymentIntentId!, d]));
  const depositsByRefund = new Map(deposits.filter((d) => d.refundId).map((d) => [d.refundId!, d]));
  const depositOf = (t: TheirTxn) =>
    t.type === 'charge'
      ? t.paymentIntentId
        ? depositsByPi.get(t.paymentIntentId)
        : undefined
      : t.sourceId
        ? depositsByRefund.get(t.sourceId)
        : undefined;
  const allTheirs = input.theirs.filter(
    (t) => t.type !== 'payout' && t.type !== 'other' && (ours(t) || depositOf(t) !== undefined),
  );
  // A deposit's own entries (its charge, its release) are matched with the deposit, never with a sale.
  const theirs = allTheirs.filter((t) => depositOf(t) === undefined);

  const periodSales = input.sales.filter(
    (s) => s.method === 'card' && MONEY_STATES.has(s.status) && s.paidAt && inPeriod(s.paidAt),
  );
  const periodSaleIds = new Set(periodSales.map((s) => s.id));
  const periodRefunds = input.refunds.filter((r) => r.method === 'card' && inPeriod(r.createdAt));
  const periodRefundIds = new Set(periodRefunds.map((r) => r.id));

  const rows: ReconRow[] = [];
  const usedSales = new Set<string>();
  const usedRefunds = new Set<string>();
  const theirPart = (t: TheirTxn) => ({
    theirsMinor: Math.abs(t.amountMinor),
    feeMinor: t.feeMinor,
    netMinor: t.netMinor,
    processorId: t.sourceId,
    txnId: t.txnId,
  });
  const none = {
    theirsMinor: null,
    differenceMinor: null,
    feeMinor: null,
    netMinor: null,
    processorId: null,
    txnId: null,
  };

  for (const t of theirs.filter((x) => x.type === 'charge')) {
    // A charge is a sale's own when it is the payment we accepted for it (its payment intent). The sale
    // named in the metadata only counts when we hold no payment for that sale: anyone who can open a
    // session at the processor can write a sale's id there.
    const named = t.saleId ? salesById.get(t.saleId) : undefined;
    const foreign = Boolean(named?.paymentIntentId && named.paymentIntentId !== t.paymentIntentId);
    const sale =
      (t.paymentIntentId ? salesByPi.get(t.paymentIntentId) : undefined) ?? (foreign ? undefined : named);
    if (sale && periodSaleIds.has(sale.id) && !usedSales.has(sale.id)) {
      usedSales.add(sale.id);
      const same = Math.abs(t.amountMinor) === sale.totalMinor;
      rows.push({
        key: t.txnId,
        kind: 'charge',
        status: same ? 'matched' : 'amount_differs',
        at: (sale.paidAt ?? t.created).toISOString(),
        saleId: sale.id,
        refundId: null,
        buyer: sale.buyer,
        oursMinor: sale.totalMinor,
        ...theirPart(t),
        differenceMinor: Math.abs(t.amountMinor) - sale.totalMinor,
        note: same ? '' : 'The processor charged a different amount from the sale.',
      });
    } else if (foreign && !sale && inPeriod(t.created)) {
      rows.push({
        key: t.txnId,
        kind: 'charge',
        status: 'theirs_only',
        at: t.created.toISOString(),
        saleId: named!.id,
        refundId: null,
        buyer: named!.buyer,
        oursMinor: null,
        ...theirPart(t),
        differenceMinor: null,
        note: 'A charge that names our sale but is not the payment we accepted for it: look into it.',
      });
    } else if (inPeriod(t.created)) {
      const note = !sale
        ? 'A charge with no sale on our side.'
        : usedSales.has(sale.id)
          ? 'A second charge for the same sale.'
          : MONEY_STATES.has(sale.status)
            ? 'Our sale is dated in another month.'
            : `Our sale is ${sale.status.replace('_', ' ')}, yet the processor took the money.`;
      rows.push({
        key: t.txnId,
        kind: 'charge',
        status: 'theirs_only',
        at: t.created.toISOString(),
        saleId: sale?.id ?? null,
        refundId: null,
        buyer: sale?.buyer ?? null,
        oursMinor: null,
        ...theirPart(t),
        differenceMinor: null,
        note,
      });
    }
  }
  for (const s of periodSales) {
    if (usedSales.has(s.id)) continue;
    rows.push({
      key: `sale-${s.id}`,
      kind: 'charge',
      status: 'ours_only',
      at: s.paidAt!.toISOString(),
      saleId: s.id,
      refundId: null,
      buyer: s.buyer,
      oursMinor: s.totalMinor,
      ...none,
      note: 'We hold this sale as paid; the processor shows no charge.',
    });
  }

  for (const t of theirs.filter((x) => x.type === 'refund')) {
    const refund = t.sourceId ? refundsByProcessorId.get(t.sourceId) : undefined;
    const sale = refund ? salesById.get(refund.saleId) : undefined;
    if (refund && periodRefundIds.has(refund.id)) {
      usedRefunds.add(refund.id);
      const same = Math.abs(t.amountMinor) === refund.amountMinor;
      rows.push({
        key: t.txnId,
        kind: 'refund',
        status: same ? 'matched' : 'amount_differs',
        at: refund.createdAt.toISOString(),
        saleId: refund.saleId,
        refundId: refund.id,
        buyer: sale?.buyer ?? null,
        oursMinor: refund.amountMinor,
        ...theirPart(t),
        differenceMinor: Math.abs(t.amountMinor) - refund.amountMinor,
        note: same ? '' : 'The processor refunded a different amount from the refund we booked.',
      });
    } else if (inPeriod(t.created)) {
      const note = refund
        ? 'Our refund is booked in another month.'
        : 'A refund at the processor that we have not booked.';
      const owner = t.saleId
        ? salesById.get(t.saleId)
        : t.paymentIntentId
          ? salesByPi.get(t.paymentIntentId)
          : undefined;
      rows.push({
        key: t.txnId,
        kind: 'refund',
        status: 'theirs_only',
        at: t.created.toISOString(),
        saleId: refund?.saleId ?? owner?.id ?? null,
        refundId: refund?.id ?? null,
        buyer: owner?.buyer ?? null,
        oursMinor: null,
        ...theirPart(t),
        differenceMinor: null,
        note,
      });
    }
  }
  for (const r of periodRefunds) {
    if (usedRefunds.has(r.id)) continue;
    rows.push({
      key: `refund-${r.id}`,
      kind: 'refund',
      status: 'ours_only',
      at: r.createdAt.toISOString(),
      saleId: r.saleId,
      refundId: r.id,
      buyer: salesById.get(r.saleId)?.buyer ?? null,
      oursMinor: r.amountMinor,
      ...none,
      note: r.processorRefundId
        ? 'The processor shows no such refund.'
        : 'This card refund never reached the processor.',
    });
  }
  depositRows(input, allTheirs, depositOf, inPeriod, theirPart, none, rows);
  rows.sort((a, b) => (a.at < b.at ? -1 : a.at > b.at ? 1 : a.key.localeCompare(b.key)));

  const counted = allTheirs.filter((t) => inPeriod(t.created));
  const payouts = input.theirs.filter(
    (t) => t.type === 'payout' && t.currency === currency && inPeriod(t.created),
  );
  const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
  const counts: Record<ReconStatus, number> = { matched: 0, ours_only: 0, theirs_only: 0, amount_differs: 0 };
  for (const r of rows) counts[r.status] += 1;
  const periodCash = input.sales.filter(
    (s) => s.method === 'cash' && MONEY_STATES.has(s.status) && s.paidAt && inPeriod(s.paidAt),
  );
  return {
    rows,
    payouts,
    // Every ledger entry of the period that carried a fee: the month's export itemises them, and they
    // add up to totals.processor.feesMinor by construction (the same entries).
    fees: counted.filter((t) => t.feeMinor !== 0),
    totals: {
      processor: {
        grossMinor: sum(counted.filter((t) => t.type === 'charge').map((t) => t.amountMinor)),
        feesMinor: sum(counted.map((t) => t.feeMinor)),
        refundsMinor: sum(counted.filter((t) => t.type === 'refund').map((t) => -t.amountMinor)),
        netMinor: sum(counted.map((t) => t.netMinor)),
        paidOutMinor: sum(payouts.map((t) => -t.amountMinor)),
      },
      ours: {
        cardMinor: sum(periodSales.map((s) => s.totalMinor)),
        cashMinor: sum(periodCash.map((s) => s.totalMinor)),
        cardRefundsMinor: sum(periodRefunds.map((r) => r.amountMinor)),
        cashRefundsMinor: sum(
          input.refunds.filter((r) => r.method === 'cash' && inPeriod(r.createdAt)).map((r) => r.amountMinor),
        ),
        depositsMinor: sum(deposits.filter((d) => !d.chargePayment && d.paidAt && inPeriod(d.paidAt)).map((d) => d.amountMinor)),
        depositReleasesMinor: sum(
          deposits.filter((d) => d.refundId && d.releasedAt && inPeriod(d.releasedAt)).map((d) => d.releasedMinor ?? 0),
        ),
        chargesMinor: sum((input.charges ?? []).filter((c) => inPeriod(c.createdAt)).map((c) => c.amountMinor)),
        chargesFromDepositsMinor: sum(
          (input.charges ?? []).filter((c) => inPeriod(c.createdAt)).map((c) => c.fromDepositMinor),
        ),
      },
      counts,
    },
  };
}

/** Rows for deposits: each taken and each given back beside the processor's entry for it. */
function depositRows(
  input: { deposits?: OurDeposit[] },
  theirs: TheirTxn[],
  depositOf: (t: TheirTxn) => OurDeposit | undefined,
  inPeriod: (d: Date) => boolean,
  theirPart: (t: TheirTxn) => Pick<ReconRow, 'theirsMinor' | 'feeMinor' | 'netMinor' | 'processorId' | 'txnId'>,
  none: Pick<ReconRow, 'theirsMinor' | 'differenceMinor' | 'feeMinor' | 'netMinor' | 'processorId' | 'txnId'>,
  rows: ReconRow[],
): void {
  const seen = new Set<string>();
  for (const t of theirs) {
    const d = depositOf(t);
    if (!d) continue;
    const taking = t.type === 'charge';
    const ourAt = taking ? d.paidAt : d.releasedAt;
    if (!(ourAt ? inPeriod(ourAt) : inPeriod(t.created))) continue;
    const oursMinor = taking ? d.amountMinor : d.releasedMinor;
    seen.add(`${t.type}-${d.id}`);
    const same = oursMinor !== null && Math.abs(t.amountMinor) === oursMinor;
    rows.push({
      deposit: true,
      ...(d.chargePayment ? { chargePayment: true as const } : {}),
      key: t.txnId,
      kind: t.type === 'charge' ? 'charge' : 'refund',
      status: same ? 'matched' : 'amount_differs',
      at: (ourAt ?? t.created).toISOString(),
      saleId: null,
      refundId: null,
      buyer: d.borrower,
      oursMinor,
      ...theirPart(t),
      differenceMinor: oursMinor === null ? null : Math.abs(t.amountMinor) - oursMinor,
      note: same
        ? d.chargePayment
          ? 'Paid by card towards charges.'
          : taking
          ? 'Deposit taken for a loan.'
          : 'Deposit given back.'
        : d.chargePayment
          ? 'The processor moved a different amount from the card payment of charges we hold.'
          : 'The processor moved a different amount from the deposit we hold.',
    });
  }
  for (const d of input.deposits ?? []) {
    for (const taking of [true, false]) {
      const at = taking ? d.paidAt : d.refundId ? d.releasedAt : null;
      if (!at || !inPeriod(at) || seen.has(`${taking ? 'charge' : 'refund'}-${d.id}`)) continue;
      rows.push({
        deposit: true,
        ...(d.chargePayment ? { chargePayment: true as const } : {}),
        key: `deposit-${taking ? 'taken' : 'released'}-${d.id}`,
        kind: taking ? 'charge' : 'refund',
        status: 'ours_only',
        at: at.toISOString(),
        saleId: null,
        refundId: null,
        buyer: d.borrower,
        oursMinor: taking ? d.amountMinor : d.releasedMinor,
        ...none,
        note: d.chargePayment
          ? 'We hold this card payment of charges as paid; the processor shows no charge.'
          : taking
          ? 'We hold this deposit as paid; the processor shows no charge.' : 'We booked this deposit as given back; the processor shows no refund.',
      });
    }
  }
}
