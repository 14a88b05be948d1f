import { describe, expect, it } from 'vitest';
import { chooseOffer, leadTimeDemand, lineFor, toOrder, type OfferIn, type PartIn } from '@/lib/restock/to-order';

// Hand-worked examples of the to-order rule (lib/restock/to-order.ts):
//   D = ceil(sold90 × leadDays / 90)      lead-time demand: average daily sales × lead time
//                                         (reorder point = daily demand × lead time — common practice (no source))
//   H = max(0, waitingHolds − onHand)     S = reorderPoint + D + H − onHand − onOrder     packs = ceil(S / packSize)

const offer = (over: Partial<OfferIn> = {}): OfferIn => ({
  offerId: 'o1',
  supplierId: 's1',
  supplierName: 'Copperleaf Supply',
  leadDays: 10,
  minOrderMinor: 0,
  itemRef: 'CL-1',
  packSize: 10,
  packPriceMinor: 450,
  preferred: true,
  ...over,
});
const part = (over: Partial<PartIn> = {}): PartIn => ({
  partId: 'p1',
  name: 'Heat-shrink sleeve',
  sku: 'HS-1',
  saleUnit: 'each',
  onHand: 0,
  reorderPoint: 0,
  waitingHolds: 0,
  onOrder: 0,
  sold90: 0,
  offers: [offer()],
  ...over,
});

describe('lead-time demand', () => {
  it('90 sold in 90 days is 1 a day: 10 over a 10-day lead time', () => {
    expect(leadTimeDemand(90, 10)).toBe(10);
  });
  it('rounds up: 40 sold over 90 days with a 7-day lead time is 40×7/90 = 3.11…, so 4', () => {
    expect(leadTimeDemand(40, 7)).toBe(4);
  });
  it('nothing sold, or no lead time, is no demand', () => {
    expect(leadTimeDemand(0, 30)).toBe(0);
    expect(leadTimeDemand(50, 0)).toBe(0);
  });
});

describe('one part', () => {
  it('below its reorder point: 3 on hand, reorder at 12 → short 9 → 1 pack of 10 at 4.50 = 4.50', () => {
    const l = lineFor(part({ onHand: 3, reorderPoint: 12 }))!;
    expect(l).toMatchObject({ short: 9, packs: 1, units: 10, lineTotalMinor: 450, reasons: ['below'] });
  });
  it('short 21 with packs of 10 → 3 packs (30 units), 3 × 450 = 1350', () => {
    const l = lineFor(part({ onHand: 4, reorderPoint: 25 }))!;
    expect(l).toMatchObject({ short: 21, packs: 3, units: 30, lineTotalMinor: 1350 });
  });
  it('at its reorder point with no sales is not listed', () => {
    expect(lineFor(part({ onHand: 12, reorderPoint: 12 }))).toBeNull();
  });
  it('what is already on order counts: 3 on hand + 10 on order ≥ 12 → not listed', () => {
    expect(lineFor(part({ onHand: 3, onOrder: 10, reorderPoint: 12 }))).toBeNull();
  });
  it('sales projection: 15 on hand, reorder at 10, 90 sold in 90 days, 10-day lead → D 10, S 10+10−15 = 5 → 1 pack', () => {
    const l = lineFor(part({ onHand: 15, reorderPoint: 10, sold90: 90 }))!;
    expect(l).toMatchObject({ leadDemand: 10, short: 5, packs: 1, reasons: ['sales'] });
  });
  it('the same part with a 4-day lead time: D = ceil(90×4/90) = 4, S = 10+4−15 = −1 → not listed', () => {
    expect(lineFor(part({ onHand: 15, reorderPoint: 10, sold90: 90, offers: [offer({ leadDays: 4 })] }))).toBeNull();
  });
  it('holds the shelf cannot serve: 1 on the shelf, 3 members waiting, reorder at 1 → H 2, S 1+2−1 = 2', () => {
    const l = lineFor(part({ onHand: 1, reorderPoint: 1, waitingHolds: 3, offers: [offer({ packSize: 1, packPriceMinor: 2500 })] }))!;
    expect(l).toMatchObject({ unmetHolds: 2, short: 2, packs: 2, units: 2, lineTotalMinor: 5000, reasons: ['holds'] });
  });
  it('without an offer: a pack of one and no price', () => {
    const l = lineFor(part({ onHand: 0, reorderPoint: 4, offers: [] }))!;
    expect(l).toMatchObject({ packs: 4, units: 4, packPriceMinor: null, lineTotalMinor: 0, offerId: null });
  });
});

describe('choosing the offer', () => {
  it('the preferred one wins even when dearer', () => {
    const a = offer({ offerId: 'a', preferred: true, packPriceMinor: 900, packSize: 10 });
    const b = offer({ offerId: 'b', preferred: false, packPriceMinor: 100, packSize: 10 });
    expect(chooseOffer([b, a])!.offerId).toBe('a');
  });
  it('without a preferred one, the lowest price per unit: 600/20 = 30 beats 350/10 = 35', () => {
    const a = offer({ offerId: 'a', preferred: false, packPriceMinor: 350, packSize: 10 });
    const b = offer({ offerId: 'b', preferred: false, packPriceMinor: 600, packSize: 20 });
    expect(chooseOffer([a, b])!.offerId).toBe('b');
  });
});

describe('grouped by supplier with totals', () => {
  it('two suppliers and one part without: totals per group and overall, minimum order flagged', () => {
    const s2 = (o: Partial<OfferIn>) => offer({ supplierId: 's2', supplierName: 'Amberline Parts', minOrderMinor: 5000, ...o });
    const r = toOrder([
      part({ partId: 'a', name: 'Solder', onHand: 2, reorderPoint: 5, offers: [offer({ packSize: 1, packPriceMinor: 1200 })] }),
      part({ partId: 'b', name: 'Wire', onHand: 0, reorderPoint: 15, offers: [s2({ packSize: 10, packPriceMinor: 800 })] }),
      part({ partId: 'c', name: 'Fuse', onHand: 0, reorderPoint: 5, offers: [s2({ packSize: 5, packPriceMinor: 300 })] }),
      part({ partId: 'd', name: 'Spare', onHand: 0, reorderPoint: 1, offers: [] }),
      part({ partId: 'e', name: 'Plenty', onHand: 50, reorderPoint: 5 }),
    ]);
    // Solder: S 3 → 3 × 1200 = 3600. Wire: S 15 → 2 packs × 800 = 1600. Fuse: S 5 → 1 × 300 = 300.
    expect(r.groups.map((g) => [g.supplierName, g.totalMinor, g.lines.map((l) => l.partId)])).toEqual([
      ['Amberline Parts', 1900, ['c', 'b']],
      ['Copperleaf Supply', 3600, ['a']],
      ['No supplier yet', 0, ['d']],
    ]);
    expect(r.totalMinor).toBe(5500);
    expect(r.lineCount).toBe(4);
    expect(r.groups[0].belowMinimum).toBe(true); // 1900 < 5000
    expect(r.groups[1].belowMinimum).toBe(false);
  });
});
