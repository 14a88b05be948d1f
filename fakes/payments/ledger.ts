// The account's ledger: one balance transaction per charge, refund and payout, a balance derived from
// them, and payouts that sweep the available balance. Funds are available at once (the real processor
// holds them for a few days; the demo has no use for that wait).
import { createEvent, type Ctx } from './context';
import { processingFee } from './fees';
import { newId, type ApiObject } from './state';

type TxnType = 'charge' | 'refund' | 'payout';

export function addBalanceTransaction(
  ctx: Ctx,
  input: { type: TxnType; amount: number; currency: string; source: string; description: string | null },
): ApiObject {
  // Charges pay the demo fee; refunds and payouts carry none (a refund does not give the fee back).
  const fee = input.type === 'charge' ? processingFee(input.amount, input.currency) : 0;
  const created = ctx.now();
  const txn: ApiObject = {
    id: newId('txn'),
    object: 'balance_transaction',
    amount: input.amount,
    available_on: created,
    created,
    currency: input.currency,
    description: input.description,
    exchange_rate: null,
    fee,
    fee_details:
      fee === 0
        ? []
        : [
            {
              amount: fee,
              application: null,
              currency: input.currency,
              description: 'Processing fees (demo rate)',
              type: 'stripe_fee',
            },
          ],
    livemode: false,
    net: input.amount - fee,
    reporting_category: input.type,
    source: input.source,
    status: 'available',
    type: input.type,
  };
  ctx.state.balanceTransactions[txn.id] = txn;
  return txn;
}

/** Available balance per currency: the sum of every transaction's net. */
export function availableByCurrency(ctx: Ctx): Map<string, number> {
  const totals = new Map<string, number>();
  for (const txn of Object.values(ctx.state.balanceTransactions)) {
    const currency = txn.currency as string;
    totals.set(currency, (totals.get(currency) ?? 0) + (txn.net as number));
  }
  return totals;
}

export function balanceObject(ctx: Ctx) {
  const available = [...availableByCurrency(ctx)].map(([currency, amount]) => ({
    amount,
    currency,
    source_types: { card: amount },
  }));
  return {
    object: 'balance',
    available,
    pending: available.map((a) => ({ ...a, amount: 0, source_types: { card: 0 } })),
    livemode: false,
  };
}

/** Pays out the whole positive available balance, one payout per currency (or just `currency`). */
export function sweepPayouts(ctx: Ctx, currency?: string): ApiObject[] {
  const payouts: ApiObject[] = [];
  for (const [cur, amount] of availableByCurrency(ctx)) {
    if (amount <= 0 || (currency && cur !== currency.toLowerCase())) continue;
    const created = ctx.now();
    const payout: ApiObject = {
      id: newId('po'),
      object: 'payout',
      amount,
      arrival_date: created,
      automatic: true,
      balance_transaction: null,
      created,
      currency: cur,
      description: 'Demo payout of the available balance',
      destination: null,
      failure_code: null,
      failure_message: null,
      livemode: false,
      metadata: {},
      method: 'standard',
      source_type: 'card',
      statement_descriptor: null,
      status: 'paid',
      type: 'bank_account',
    };
    const txn = addBalanceTransaction(ctx, {
      type: 'payout',
      amount: -amount,
      currency: cur,
      source: payout.id,
      description: 'Payout',
    });
    payout.balance_transaction = txn.id;
    ctx.state.payouts[payout.id] = payout;
    createEvent(ctx, 'payout.created', payout);
    createEvent(ctx, 'payout.paid', payout);
    payouts.push(payout);
  }
  return payouts;
}
