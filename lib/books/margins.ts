import type { PartCategory } from '@/lib/domain';
import { costOf, roundHalfAwayFromZero, unitCostAt, type CostBasis } from './unit-cost';

// The month's margin per category. Pure, so it is worked by hand in tests/unit/books/margins.test.ts.
//
// Sold: each sale line paid in the month, before tax (its net in the books for filing), less the share
// of units refunded since (net × kept ÷ qty, rounded half away from zero). Cost of goods sold: the units
// kept × the price per unit that held when the sale was paid (lib/books/unit-cost.ts: last price paid
// on receiving, else the preferred offer, else unknown). A line whose cost is unknown is left out of the
// margin and counted on its own, never costed at 0.
// Margin = sold − cost over the lines whose cost is known; margin % = margin ÷ those lines' sales
// (gross margin as a share of sales: common practice (no source)), to one decimal, half away from zero.

export type MarginLine = {
  partId: string;
  category: PartCategory;
  at: Date;
  qty: number;
  refundedQty: number;
  netMinor: number;
};

export type CategoryMargin = {
  category: PartCategory | 'all';
  /** Sales before tax of every line, known cost or not. */
  soldMinor: number;
  /** Cost of the lines whose cost is known. */
  costMinor: number;
  /** Sold − cost over the lines whose cost is known; null when no line's cost is known. */
  marginMinor: number | null;
  /** Margin as a share of those lines' sales, one decimal; null when it cannot be said. */
  marginPct: number | null;
  /** Lines costed at the preferred offer because nothing had been received before the sale. */
  offerLines: number;
  /** Lines whose cost is known. */
  knownLines: number;
  /** Lines whose cost is unknown, and what they sold for. */
  unknownLines: number;
  unknownSoldMinor: number;
};

const blank = (category: CategoryMargin['category']): CategoryMargin => ({
  category,
  soldMinor: 0,
  costMinor: 0,
  marginMinor: null,
  marginPct: null,
  offerLines: 0,
  knownLines: 0,
  unknownLines: 0,
  unknownSoldMinor: 0,
});

/** Per category (in name order) and, last, all categories together. */
export function marginsByCategory(lines: MarginLine[], bases: Map<string, CostBasis>): CategoryMargin[] {
  const byCat = new Map<PartCategory, CategoryMargin>();
  const all = blank('all');
  for (const l of lines) {
    const kept = l.qty - l.refundedQty;
    if (!(kept > 0) || !(l.qty > 0)) continue;
    const sold = kept === l.qty ? l.netMinor : roundHalfAwayFromZero((l.netMinor * kept) / l.qty);
    const unit = unitCostAt(bases.get(l.partId), l.at);
    const c = byCat.get(l.category) ?? blank(l.category);
    byCat.set(l.category, c);
    for (const m of [c, all]) {
      m.soldMinor += sold;
      if (!unit) {
        m.unknownLines += 1;
        m.unknownSoldMinor += sold;
        continue;
      }
      m.knownLines += 1;
      if (unit.source === 'offer') m.offerLines += 1;
      m.costMinor += costOf(kept, unit);
    }
  }
  const out = [...byCat.values()].sort((a, b) => a.category.localeCompare(b.category));
  if (out.length) out.push(all);
  for (const m of out) {
    if (m.knownLines === 0) continue;
    const knownSold = m.soldMinor - m.unknownSoldMinor;
    m.marginMinor = knownSold - m.costMinor;
    m.marginPct = knownSold === 0 ? null : roundHalfAwayFromZero((m.marginMinor * 1000) / knownSold) / 10;
  }
  return out;
}
