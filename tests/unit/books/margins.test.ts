import { describe, expect, it } from 'vitest';
import { marginsByCategory, type MarginLine } from '@/lib/books/margins';
import { costOf, roundHalfAwayFromZero, unitCostAt, type CostBasis } from '@/lib/books/unit-cost';

// Cost of goods sold and margins, worked by hand. The valuation rule (last price paid on receiving, else
// the preferred offer, else unknown) is common practice (no source); the rounding rule is half away from
// zero to the minor unit (ISO 4217: USD has two minor digits, so amounts here are cents).

const d = (s: string) => new Date(`2026-10-${s}T18:00:00Z`);

// Solder pads: 30 received on the 5th for 1000 (33⅓ each), 10 on the 20th for 400 (40 each); offer 10 for 380.
const pads: CostBasis = {
  received: [
    { at: d('05'), units: 30, costMinor: 1000 },
    { at: d('20'), units: 10, costMinor: 400 },
  ],
  offer: { packSize: 10, packPriceMinor: 380 },
};
// Twin lead by the metre: a 25 m reel received on the 1st for 1037 (41.48 a metre), no offer.
const lead: CostBasis = { received: [{ at: d('01'), units: 25, costMinor: 1037 }], offer: null };
const bases = new Map([
  ['pads', pads],
  ['lead', lead],
]);

describe('the price per unit that holds at a moment', () => {
  it('is the last received at or before it, else the preferred offer, else unknown (never 0)', () => {
    expect(unitCostAt(pads, d('03'))).toEqual({ source: 'offer', costMinor: 380, perUnits: 10 });
    expect(unitCostAt(pads, d('10'))).toEqual({ source: 'received', costMinor: 1000, perUnits: 30 });
    expect(unitCostAt(pads, d('20'))).toEqual({ source: 'received', costMinor: 400, perUnits: 10 });
    expect(unitCostAt({ received: [], offer: null }, d('20'))).toBeNull();
    expect(unitCostAt(undefined, d('20'))).toBeNull();
    // A receipt after the moment does not count, even with no offer to fall back on.
    expect(unitCostAt(lead, new Date('2026-09-30T00:00:00Z'))).toBeNull();
  });

  it('rounds quantity × price half away from zero, once per line, for whole and decimal quantities', () => {
    expect(costOf(1, { source: 'offer', costMinor: 5, perUnits: 2 })).toBe(3); // 2.5 → 3
    expect(costOf(-1, { source: 'offer', costMinor: 5, perUnits: 2 })).toBe(-3); // −2.5 → −3
    expect(costOf(3, { source: 'received', costMinor: 1000, perUnits: 30 })).toBe(100); // 3 × 33⅓ = 100
    expect(costOf(1.5, { source: 'received', costMinor: 1037, perUnits: 25 })).toBe(62); // 62.22 → 62
    // 1.005 m × 1000 is 1004.9999999999999 in binary; settled first, it is the 1005 worked on paper.
    expect(costOf(1.005, { source: 'received', costMinor: 1000, perUnits: 1 })).toBe(1005);
    expect(roundHalfAwayFromZero(0.1 * 3 * 5)).toBe(2); // 1.5000000000000002 → 1.5 → 2
    expect(roundHalfAwayFromZero(-0.4)).toBe(0);
  });
});

describe('margins per category', () => {
  const lines: MarginLine[] = [
    // Before anything was received: 2 at the offer, 2 × 380 / 10 = 76.
    { partId: 'pads', category: 'consumable', at: d('03'), qty: 2, refundedQty: 0, netMinor: 200 },
    // After the first receipt: 3 × 1000 / 30 = 100.
    { partId: 'pads', category: 'consumable', at: d('10'), qty: 3, refundedQty: 0, netMinor: 300 },
    // At the very moment of the second receipt (at or before counts): 1 × 40 = 40.
    { partId: 'pads', category: 'consumable', at: d('20'), qty: 1, refundedQty: 0, netMinor: 100 },
    // 4 sold, 1 refunded: 3 kept, sold 400 × 3 / 4 = 300, cost 3 × 40 = 120.
    { partId: 'pads', category: 'consumable', at: d('25'), qty: 4, refundedQty: 1, netMinor: 400 },
    // 2.5 m of a lead nobody has a price for: cost unknown.
    { partId: 'nolead', category: 'wire', at: d('12'), qty: 2.5, refundedQty: 0, netMinor: 150 },
    // 1.5 m of the reel: 62.22 → 62.
    { partId: 'lead', category: 'wire', at: d('12'), qty: 1.5, refundedQty: 0, netMinor: 120 },
    // Refunded in full: nothing kept, nothing sold, nothing costed.
    { partId: 'pads', category: 'consumable', at: d('26'), qty: 1, refundedQty: 1, netMinor: 100 },
  ];
  const [consumable, wire, all] = marginsByCategory(lines, bases);

  it('consumables: sold 900, cost 76 + 100 + 40 + 120 = 336, margin 564, 564 / 900 = 62.67 % → 62.7 %', () => {
    expect(consumable).toEqual({
      category: 'consumable',
      soldMinor: 900,
      costMinor: 336,
      marginMinor: 564,
      marginPct: 62.7,
      offerLines: 1,
      knownLines: 4,
      unknownLines: 0,
      unknownSoldMinor: 0,
    });
  });

  it('wire: the unknown line is shown apart and left out of the margin: 120 − 62 = 58, 58 / 120 = 48.3 %', () => {
    expect(wire).toMatchObject({
      category: 'wire',
      soldMinor: 270,
      costMinor: 62,
      marginMinor: 58,
      marginPct: 48.3,
      knownLines: 1,
      unknownLines: 1,
      unknownSoldMinor: 150,
    });
  });

  it('all together: known sales 1020, cost 398, margin 622, 622 / 1020 = 60.98 % → 61 %', () => {
    expect(all).toMatchObject({ category: 'all', soldMinor: 1170, costMinor: 398, marginMinor: 622, marginPct: 61, unknownLines: 1 });
  });

  it('a category whose every cost is unknown has no margin at all (null), not a margin against 0', () => {
    const [only] = marginsByCategory([{ partId: 'nolead', category: 'wire', at: d('12'), qty: 2, refundedQty: 0, netMinor: 150 }], bases);
    expect(only).toMatchObject({ soldMinor: 150, costMinor: 0, marginMinor: null, marginPct: null, unknownLines: 1 });
  });

  it('a partly refunded line keeps its share, half away from zero: 100 × 2 / 3 = 66.67 → 67', () => {
    const [c] = marginsByCategory([{ partId: 'pads', category: 'consumable', at: d('10'), qty: 3, refundedQty: 1, netMinor: 100 }], bases);
    // Cost: 2 × 1000 / 30 = 66.67 → 67; margin 0.
    expect(c).toMatchObject({ soldMinor: 67, costMinor: 67, marginMinor: 0, marginPct: 0 });
  });
});
