import { describe, expect, it } from 'vitest';
import { paymentMismatch } from '@/lib/sales/accept';

// Money the processor reports is a sale's payment only through the session Ohmstead opened for it,
// for the sale's exact amount and currency (ISO 4217 codes compare without regard to case).

const sale = {
  id: '0b1f3f8e-7d7a-4f7e-9a51-0f0c2b7d1a11',
  space_id: '6a1c9a57-1d2e-4c55-8f0e-0b3c6a0e7a01',
  checkout_session_id: 'cs_ours',
  total_minor: 90,
  currency: 'USD',
};

describe('paymentMismatch', () => {
  it('accepts the sale’s own session with its exact amount and currency', () => {
    expect(paymentMismatch(sale, { sessionId: 'cs_ours', amountMinor: 90, currency: 'usd' })).toBeNull();
  });

  it.each([
    ['another session', { sessionId: 'cs_theirs', amountMinor: 90, currency: 'usd' }, /not the one/],
    ['no session', { sessionId: null, amountMinor: 90, currency: 'usd' }, /not the one/],
    ['one cent', { sessionId: 'cs_ours', amountMinor: 1, currency: 'usd' }, /amount \(1\)/],
    ['a cent more', { sessionId: 'cs_ours', amountMinor: 91, currency: 'usd' }, /amount \(91\)/],
    ['no amount', { sessionId: 'cs_ours', amountMinor: null, currency: 'usd' }, /amount \(none\)/],
    ['another currency', { sessionId: 'cs_ours', amountMinor: 90, currency: 'eur' }, /currency \(EUR\)/],
    ['no currency', { sessionId: 'cs_ours', amountMinor: 90, currency: null }, /currency \(none\)/],
  ])('refuses %s', (_name, ev, why) => {
    expect(paymentMismatch(sale, ev)).toMatch(why);
  });

  it('refuses everything for a sale that never stored a session', () => {
    expect(
      paymentMismatch(
        { ...sale, checkout_session_id: null },
        { sessionId: null, amountMinor: 90, currency: 'usd' },
      ),
    ).toMatch(/not the one/);
  });
});
