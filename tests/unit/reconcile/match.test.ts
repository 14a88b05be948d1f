import { describe, expect, it } from 'vitest';
import type { TheirTxn } from '@/lib/reconcile/ledger';
import { matchPeriod, type OurSale } from '@/lib/reconcile/match';

// A charge that names one of our sales in its metadata but is not the payment we recorded for it (a
// checkout session someone else opened) is never matched to that sale: the sale's own payment is.

const SPACE = '6a1c9a57-1d2e-4c55-8f0e-0b3c6a0e7a01';
const SALE = '0b1f3f8e-7d7a-4f7e-9a51-0f0c2b7d1a11';
const from = new Date('2026-11-01T00:00:00Z');
const to = new Date('2026-12-01T00:00:00Z');

const sale: OurSale = {
  id: SALE,
  method: 'card',
  status: 'paid',
  totalMinor: 90,
  paidAt: new Date('2026-11-10T12:05:00Z'),
  paymentIntentId: 'pi_genuine',
  buyer: 'Juniper',
};

const charge = (txnId: string, pi: string, amount: number, at: string): TheirTxn => ({
  txnId,
  type: 'charge',
  amountMinor: amount,
  feeMinor: 1,
  netMinor: amount - 1,
  currency: 'USD',
  created: new Date(at),
  sourceId: `ch_${pi}`,
  saleId: SALE,
  spaceId: SPACE,
  paymentIntentId: pi,
});

describe('matching charges to sales', () => {
  it('matches the sale’s own payment and shows a foreign charge naming it as only at the processor', () => {
    const { rows } = matchPeriod({
      from,
      to,
      spaceId: SPACE,
      currency: 'USD',
      sales: [sale],
      refunds: [],
      // The foreign one-cent charge came first.
      theirs: [
        charge('txn_foreign', 'pi_foreign', 1, '2026-11-10T12:00:00Z'),
        charge('txn_genuine', 'pi_genuine', 90, '2026-11-10T12:05:00Z'),
      ],
    });
    const byTxn = Object.fromEntries(rows.map((r) => [r.txnId, r]));
    expect(byTxn.txn_genuine).toMatchObject({ status: 'matched', saleId: SALE, oursMinor: 90 });
    expect(byTxn.txn_foreign).toMatchObject({ status: 'theirs_only', saleId: SALE, oursMinor: null });
    expect(byTxn.txn_foreign.note).toMatch(/not the payment/i);
  });

  it('still matches by the sale named in the metadata when we hold no payment id for it', () => {
    const { rows } = matchPeriod({
      from,
      to,
      spaceId: SPACE,
      currency: 'USD',
      sales: [{ ...sale, paymentIntentId: null }],
      refunds: [],
      theirs: [charge('txn_genuine', 'pi_genuine', 90, '2026-11-10T12:05:00Z')],
    });
    expect(rows).toEqual([expect.objectContaining({ status: 'matched', saleId: SALE })]);
  });
});
