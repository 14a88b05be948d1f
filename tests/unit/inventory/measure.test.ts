import { describe, expect, it } from 'vitest';
import { formatQty, hasAtMostThreeDecimals, parseMeasure, qtyProblem, roundQty, sumQty } from '@/lib/inventory/measure';
import { formatUnitPrice, lineAmountMinor } from '@/lib/money';
import { receivedCostMinor } from '@/lib/restock/order-words';
import { leadTimeDemand, lineFor } from '@/lib/restock/to-order';

// Units of measure (migration 0014). Amounts are USD cents (ISO 4217: two minor digits). Every expected
// figure is worked by hand beside it; the rounding rule is half away from zero (as lib/sales/tax.ts).

describe('a line amount: round(qty × unit price), half away from zero', () => {
  it('2.5 m at 160 per metre is 400', () => expect(lineAmountMinor(2.5, 160)).toBe(400));
  it('0.125 m at 60 is 7.5 → 8 (the half goes away from zero)', () => expect(lineAmountMinor(0.125, 60)).toBe(8));
  it('0.001 m at 1 is 0.001 → 0', () => expect(lineAmountMinor(0.001, 1)).toBe(0));
  it('0.1 + 0.2 m at 1000 is 300, not a binary fraction off', () => expect(lineAmountMinor(0.1 + 0.2, 1000)).toBe(300));
  it('3 items at 45 is 135, exactly as before', () => expect(lineAmountMinor(3, 45)).toBe(135));
  it('12.345 g at 14 is 172.83 → 173', () => expect(lineAmountMinor(12.345, 14)).toBe(173));
});

describe('which quantities a unit takes', () => {
  it('whole items refuse 1.5, naming why', () => expect(qtyProblem(1.5, 'each')).toMatch(/whole number/));
  it('metres take 65.5 and 0.001 but not 0.0005', () => {
    expect(qtyProblem(65.5, 'metre')).toBeNull();
    expect(qtyProblem(0.001, 'metre')).toBeNull();
    expect(qtyProblem(0.0005, 'metre')).toMatch(/at most 3 decimals/);
  });
  it('reads three decimals despite float noise', () => {
    expect(hasAtMostThreeDecimals(0.1 + 0.2)).toBe(true);
    expect(roundQty(0.1 + 0.2)).toBe(0.3);
    expect(sumQty([65.5, -40.25, 0.001])).toBe(25.251);
  });
});

describe('the words people read', () => {
  it('quantities carry their symbol', () => {
    expect(formatQty(65.5, 'metre')).toBe('65.5 m');
    expect(formatQty(420, 'gram')).toBe('420 g');
    expect(formatQty(3, 'each')).toBe('3');
  });
  it('prices say per metre and per gram, and each only for items', () => {
    expect(formatUnitPrice(160, 'USD', 'metre')).toBe('$1.60 per metre');
    expect(formatUnitPrice(14, 'USD', 'gram')).toBe('$0.14 per gram');
    expect(formatUnitPrice(45, 'USD', 'each')).toBe('$0.45 each');
  });
  it('typed units read as ours', () => {
    expect(parseMeasure('Metres')).toBe('metre');
    expect(parseMeasure('g')).toBe('gram');
    expect(parseMeasure('bag')).toBeNull();
  });
});

describe('restocking in metres', () => {
  it('12.5 m received of a 25 m reel at 2000 a reel costs 12.5 × 2000 / 25 = 1000', () =>
    expect(receivedCostMinor(12.5, 2000, 25)).toBe(1000));
  it('0.3 m at 1000 per 0.7 m pack is 428.57… → 429 (half up)', () => expect(receivedCostMinor(0.3, 1000, 0.7)).toBe(429));
  it('lead-time demand of 37.5 m sold in 90 days over 7 days: ceil(37.5 × 7 / 90) = ceil(2.92) = 3', () =>
    expect(leadTimeDemand(37.5, 7)).toBe(3));
  it('short 10.5 m in 25 m reels is one reel of 25 m', () => {
    const line = lineFor({
      partId: 'p',
      name: 'Twin lead',
      sku: 'W',
      saleUnit: 'metre',
      onHand: 9.5,
      reorderPoint: 20,
      waitingHolds: 0,
      onOrder: 0,
      sold90: 0,
      offers: [
        { offerId: 'o', supplierId: 's', supplierName: 'S', leadDays: 0, minOrderMinor: 0, itemRef: '', packSize: 25, packPriceMinor: 2000, preferred: true },
      ],
    });
    expect(line).toMatchObject({ short: 10.5, packs: 1, units: 25, lineTotalMinor: 2000 });
  });
});
