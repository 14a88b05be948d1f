import { describe, expect, it } from 'vitest';
import { splitDeposit } from '@/lib/deposits/checkout';
import type { TheirTxn } from '@/lib/reconcile/ledger';
import { matchPeriod, type OurDeposit } from '@/lib/reconcile/match';

// The deposit's split is integer minor units (ISO 4217) throughout: nothing is rounded, so kept + given
// back is always exactly what was paid. In the Books a deposit's charge and its release are their own
// rows, matched by payment intent and refund id, and never taken for a sale's payment.

describe('splitting a deposit', () => {
  it('keeps the charges and gives back the rest', () => {
    expect(splitDeposit(5000, 1200)).toEqual({ keptMinor: 1200, releasedMinor: 3800 });
  });
  it('never keeps more than was paid: a charge beyond it stays owed elsewhere', () => {
    expect(splitDeposit(5000, 6000)).toEqual({ keptMinor: 5000, releasedMinor: 0 });
  });
  it('gives all of it back when nothing is charged', () => {
    expect(splitDeposit(5000, 0)).toEqual({ keptMinor: 0, releasedMinor: 5000 });
  });
});

const SPACE = '6a1c9a57-1d2e-4c55-8f0e-0b3c6a0e7a01';
const from = new Date('2026-11-01T00:00:00Z');
const to = new Date('2026-12-01T00:00:00Z');
const txn = (txnId: string, type: 'charge' | 'refund', amount: number, over: Partial<TheirTxn>): TheirTxn => ({
  txnId,
  type,
  amountMinor: amount,
  feeMinor: type === 'charge' ? 175 : 0,
  netMinor: amount - (type === 'charge' ? 175 : 0),
  currency: 'USD',
  created: new Date('2026-11-12T10:00:00Z'),
  sourceId: null,
  saleId: null,
  spaceId: SPACE,
  paymentIntentId: null,
  ...over,
});
const deposit: OurDeposit = {
  id: 'dep-1',
  borrower: 'Rowan Tilley',
  amountMinor: 5000,
  paidAt: new Date('2026-11-12T10:00:00Z'),
  paymentIntentId: 'pi_dep',
  refundId: 're_dep',
  releasedMinor: 3800,
  releasedAt: new Date('2026-11-14T10:00:00Z'),
};

describe('deposits in the Books', () => {
  it('matches the deposit taken and given back, and counts them apart from sales', () => {
    const { rows, totals } = matchPeriod({
      from,
      to,
      spaceId: SPACE,
      currency: 'USD',
      sales: [],
      refunds: [],
      deposits: [deposit],
      charges: [{ amountMinor: 1200, fromDepositMinor: 1200, createdAt: new Date('2026-11-14T10:00:00Z') }],
      theirs: [
        txn('txn_take', 'charge', 5000, { sourceId: 'ch_dep', paymentIntentId: 'pi_dep' }),
        txn('txn_back', 'refund', -3800, { sourceId: 're_dep', paymentIntentId: 'pi_dep', created: new Date('2026-11-14T10:00:00Z') }),
      ],
    });
    expect(rows.map((r) => [r.txnId, r.kind, r.status, r.oursMinor, r.deposit, r.buyer])).toEqual([
      ['txn_take', 'charge', 'matched', 5000, true, 'Rowan Tilley'],
      ['txn_back', 'refund', 'matched', 3800, true, 'Rowan Tilley'],
    ]);
    expect(totals.ours).toMatchObject({
      cardMinor: 0,
      depositsMinor: 5000,
      depositReleasesMinor: 3800,
      chargesMinor: 1200,
      chargesFromDepositsMinor: 1200,
    });
    expect(totals.processor.grossMinor).toBe(5000);
    expect(totals.counts).toMatchObject({ matched: 2, theirs_only: 0, ours_only: 0 });
  });

  it('shows a deposit we hold as paid with no charge at the processor as ours only', () => {
    const { rows } = matchPeriod({
      from,
      to,
      spaceId: SPACE,
      currency: 'USD',
      sales: [],
      refunds: [],
      deposits: [{ ...deposit, refundId: null, releasedAt: null, releasedMinor: null }],
      theirs: [],
    });
    expect(rows).toMatchObject([{ status: 'ours_only', kind: 'charge', oursMinor: 5000, deposit: true }]);
  });
});
