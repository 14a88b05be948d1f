import type Stripe from 'stripe';

// The processor's side of the books: its balance transactions (charges, refunds, payouts, each with
// its fee) for a time window, fetched through the SDK page by page, each with its source object so
// it can be traced back to a sale (metadata) or a payment intent.

export type TheirTxn = {
  txnId: string;
  type: 'charge' | 'refund' | 'payout' | 'other';
  amountMinor: number; // signed, as the processor books it (refunds and payouts negative)
  feeMinor: number;
  netMinor: number;
  currency: string; // upper case ISO 4217
  created: Date;
  sourceId: string | null;
  saleId: string | null;
  spaceId: string | null;
  paymentIntentId: string | null;
};

type SourceLike = { id?: string; metadata?: Record<string, string> | null; payment_intent?: unknown };

const idOf = (v: unknown) =>
  typeof v === 'string'
    ? v
    : v && typeof v === 'object' && 'id' in v
      ? String((v as { id: string }).id)
      : null;

export function toTheirTxn(t: Stripe.BalanceTransaction): TheirTxn {
  const source = (t.source && typeof t.source === 'object' ? t.source : null) as SourceLike | null;
  const type =
    t.type === 'charge' || t.type === 'payment'
      ? 'charge'
      : t.type === 'refund' || t.type === 'payment_refund'
        ? 'refund'
        : t.type === 'payout'
          ? 'payout'
          : 'other';
  return {
    txnId: t.id,
    type,
    amountMinor: t.amount,
    feeMinor: t.fee,
    netMinor: t.net,
    currency: t.currency.toUpperCase(),
    created: new Date(t.created * 1000),
    sourceId: idOf(t.source),
    saleId: source?.metadata?.saleId ?? null,
    spaceId: source?.metadata?.spaceId ?? null,
    paymentIntentId: idOf(source?.payment_intent),
  };
}

/** Every balance transaction created in [from, to), all pages. */
export async function fetchLedger(stripe: Stripe, window: { from: Date; to: Date }): Promise<TheirTxn[]> {
  const out: TheirTxn[] = [];
  const pages = stripe.balanceTransactions.list({
    created: { gte: Math.floor(window.from.getTime() / 1000), lt: Math.floor(window.to.getTime() / 1000) },
    limit: 100,
    expand: ['data.source'],
  });
  for await (const t of pages) out.push(toTheirTxn(t));
  return out;
}
