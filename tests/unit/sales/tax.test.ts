import { describe, expect, it } from 'vitest';
import { allocateTax, divRoundHalfUp, formatRate, refundAmountForLines, refundTax, taxSale } from '@/lib/sales/tax';

// Every expected figure below is worked by hand in the comment beside it. Rounding rule under test:
// once per sale, half away from zero (amounts are ≥ 0, so half up), to the ISO 4217 minor unit.

describe('taxSale — exclusive (tax added to shelf prices)', () => {
  it('8.25 % on 19.99: 1999 × 0.0825 = 164.9175 → 165; pays 21.64', () => {
    expect(taxSale(1999, { mode: 'exclusive', rateBp: 825 })).toEqual({
      linesMinor: 1999,
      taxMinor: 165,
      totalMinor: 2164,
      netMinor: 1999,
    });
  });
  it('8.25 % on 2.00: 200 × 0.0825 = 16.5 exactly → half away from zero → 17; pays 2.17', () => {
    expect(taxSale(200, { mode: 'exclusive', rateBp: 825 }).taxMinor).toBe(17);
    expect(taxSale(200, { mode: 'exclusive', rateBp: 825 }).totalMinor).toBe(217);
  });
  it('8.25 % on 1.00: 100 × 0.0825 = 8.25 → 8 (below the half)', () => {
    expect(taxSale(100, { mode: 'exclusive', rateBp: 825 }).taxMinor).toBe(8);
  });
  it('per sale, not per line: two lines of 1.00 at 8.25 % are 200 → 16.5 → 17, not 8 + 8 = 16', () => {
    expect(taxSale(100 + 100, { mode: 'exclusive', rateBp: 825 }).taxMinor).toBe(17);
  });
  it('10 % on JPY 1,235 (ISO 4217: 0 minor digits): 123.5 → 124 yen', () => {
    expect(taxSale(1235, { mode: 'exclusive', rateBp: 1000 }).totalMinor).toBe(1359);
  });
});

describe('taxSale — inclusive (tax inside shelf prices)', () => {
  it('20 % inside 10.00: 1000 × 20/120 = 166.67 → 167; net 8.33; pays 10.00', () => {
    expect(taxSale(1000, { mode: 'inclusive', rateBp: 2000 })).toEqual({
      linesMinor: 1000,
      taxMinor: 167,
      totalMinor: 1000,
      netMinor: 833,
    });
  });
  it('20 % inside 0.03: 3 × 20/120 = 0.5 exactly → 1', () => {
    expect(taxSale(3, { mode: 'inclusive', rateBp: 2000 }).taxMinor).toBe(1);
  });
  it('7.5 % inside 4.30: 430 × 750/10750 = 30.0 exactly → 30; net 4.00', () => {
    expect(taxSale(430, { mode: 'inclusive', rateBp: 750 })).toMatchObject({ taxMinor: 30, netMinor: 400 });
  });
});

describe('taxSale — exempt', () => {
  it('no tax whatever the rate', () => {
    expect(taxSale(1234, { mode: 'exempt', rateBp: 2000 })).toEqual({
      linesMinor: 1234,
      taxMinor: 0,
      totalMinor: 1234,
      netMinor: 1234,
    });
  });
});

describe('refunds', () => {
  it('a line of 2.00 back under exclusive 8.25 % returns 2.17', () => {
    expect(refundAmountForLines(200, { mode: 'exclusive', rateBp: 825 })).toBe(217);
  });
  it('share of the tax: 2.17 back of a 21.64 sale with 1.65 tax: 217 × 165 / 2164 = 16.55 → 17', () => {
    expect(refundTax({ amountMinor: 217, saleTotalMinor: 2164, saleTaxMinor: 165, taxLeftMinor: 165, isAllLeft: false })).toBe(17);
  });
  it('the rest of the sale takes the rest of the tax (165 − 17 = 148), so the tax returns exactly', () => {
    expect(refundTax({ amountMinor: 1947, saleTotalMinor: 2164, saleTaxMinor: 165, taxLeftMinor: 148, isAllLeft: true })).toBe(148);
  });
  it('no tax on a sale without tax', () => {
    expect(refundTax({ amountMinor: 500, saleTotalMinor: 500, saleTaxMinor: 0, taxLeftMinor: 0, isAllLeft: true })).toBe(0);
  });
});

describe('helpers', () => {
  it('divRoundHalfUp: 5/2 → 3, 7/3 → 2, 8/3 → 3', () => {
    expect([divRoundHalfUp(5n, 2n), divRoundHalfUp(7n, 3n), divRoundHalfUp(8n, 3n)]).toEqual([3n, 2n, 3n]);
  });
  it('formatRate', () => {
    expect([formatRate(825), formatRate(2000), formatRate(750), formatRate(5)]).toEqual(['8.25 %', '20 %', '7.5 %', '0.05 %']);
  });
});

describe('allocateTax (largest remainder / Hamilton method)', () => {
  it('17 of tax over lines of 1.00 and 1.00: 8.5 each → 8 + 8, one cent left to the first of the tie → [9, 8]', () => {
    expect(allocateTax([100, 100], 17)).toEqual([9, 8]);
  });
  it('167 over 600 and 400: 100.2 and 66.8 → 100 + 66 = 166, the cent goes to .8 → [100, 67]', () => {
    expect(allocateTax([600, 400], 167)).toEqual([100, 67]);
  });
  it('always sums to the sale’s tax', () => {
    const lines = [333, 333, 334, 1, 999];
    expect(allocateTax(lines, 101).reduce((a, b) => a + b, 0)).toBe(101);
  });
  it('no tax, no shares', () => {
    expect(allocateTax([100, 200], 0)).toEqual([0, 0]);
  });
});
