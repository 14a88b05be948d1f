// What goods cost us, for the Books' margins and for write-offs at cost. Pure.
//
// The rule (common practice (no source): valuing goods at the last price paid for them):
//   1. the price per unit last paid on receiving at or before the moment — a received order line's
//      cost ÷ its units (what the line cost as received, at the price paid);
//   2. else the preferred supplier offer's pack price ÷ its pack size (what we would pay today);
//   3. else the cost is unknown: shown as unknown, never as 0.
// An amount is quantity × price per unit, rounded once per line HALF AWAY FROM ZERO to the currency's
// minor unit (ISO 4217), the same rounding rule as tax (lib/sales/tax.ts). Quantities may be fractions
// (metres, grams), so the arithmetic takes any finite number.

export type Received = { at: Date; units: number; costMinor: number };
export type CostBasis = {
  /** Receipt lines of the part, oldest first. */
  received: Received[];
  /** The preferred offer, if the part has one. */
  offer: { packSize: number; packPriceMinor: number } | null;
};
/** A price per unit as a fraction of minor units (so no binary fraction decides a cent before rounding). */
export type UnitCost = { source: 'received' | 'offer'; costMinor: number; perUnits: number };

/** The price per unit that holds at `at`, or null when nothing tells us (cost unknown). */
export function unitCostAt(basis: CostBasis | undefined, at: Date): UnitCost | null {
  if (!basis) return null;
  let last: Received | null = null;
  for (const r of basis.received) if (r.at.getTime() <= at.getTime() && r.units > 0) last = r;
  if (last) return { source: 'received', costMinor: last.costMinor, perUnits: last.units };
  if (basis.offer && basis.offer.packSize > 0)
    return { source: 'offer', costMinor: basis.offer.packPriceMinor, perUnits: basis.offer.packSize };
  return null;
}

/** x rounded half away from zero to a whole minor unit (x within a millionth of a half counts as a half). */
export function roundHalfAwayFromZero(x: number): number {
  const a = Math.abs(x);
  // Products of decimal quantities carry binary noise (0.1 × 3 = 0.30000000000000004): settle it first
  // (below 10⁹ minor units, where a millionth is still exact in a double).
  const settled = a < 1e9 ? Math.round(a * 1e6) / 1e6 : a;
  const r = Math.floor(settled + 0.5);
  return r === 0 ? 0 : Math.sign(x) * r;
}

/** What `qty` units cost at `unit`, in minor units (negative qty: negative cost). */
export function costOf(qty: number, unit: UnitCost): number {
  return roundHalfAwayFromZero((qty * unit.costMinor) / unit.perUnits);
}

/** The words for where a cost came from, for screens and the filing file. */
export function costSourceWords(unit: UnitCost | null): string {
  if (!unit) return 'cost unknown';
  return unit.source === 'received' ? 'at the price last paid' : 'at the preferred offer’s price';
}
