import { describe, expect, it } from 'vitest';
import { categoryDeposit } from '@/lib/deposits/take';

// A loose borrow's deposit: the space's amount for each part category in it, once per category, summed
// (minor units, ISO 4217). Worked by hand.

describe('the deposit on loose parts', () => {
  const amounts = { meter: 2500, wire: 300 };
  it('is the sum over the categories present, each once however many parts of it', () => {
    expect(categoryDeposit(amounts, ['meter', 'meter', 'wire', 'supply'])).toBe(2800);
  });
  it('is none when no category in the borrow asks for one', () => {
    expect(categoryDeposit(amounts, ['supply', 'led'])).toBeNull();
    expect(categoryDeposit({}, ['meter'])).toBeNull();
  });
});
