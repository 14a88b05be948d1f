// IEC 60063 preferred number series: one decade of each, from 1.0 up.
export const E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2] as const;
export const E24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
] as const;

export type ESeries = readonly number[];
export type ESeriesName = 'E12' | 'E24';
export const SERIES: Record<ESeriesName, ESeries> = { E12, E24 };

// Decade scaling multiplies by powers of ten; rounding to 12 significant digits removes the float dust
// (4.7 × 10 = 47.00000000000001) so that 47 Ω prints and compares as 47.
const clean = (x: number) => Number(x.toPrecision(12));

// Both searches look at the value's decade and at the next power of ten (the next decade's first value:
// every IEC 60063 series starts at 1.0). log10 can land one decade low at an exact power of ten
// (log10(1000) = 2.9999999999999996), and then that power is the answer; it can land one high only within
// float dust under a power of ten, where `clean` makes the value that power.
const decadeOf = (value: number) => Math.floor(Math.log10(value));
const candidates = (decade: number, series: ESeries) => [
  ...series.map((s) => clean(s * Math.pow(10, decade))),
  clean(Math.pow(10, decade + 1)),
];

/**
 * The smallest value of the series (in any decade) that is at or above `value`.
 * Used for series resistors: rounding the resistance up keeps the current at or below the target.
 */
export function nearestAtOrAbove(value: number, series: ESeries = E24): number {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError('value must be a positive finite number');
  const target = clean(value);
  return Math.min(...candidates(decadeOf(value), series).filter((c) => c >= target));
}

/** The largest value of the series at or below `value`. */
export function nearestAtOrBelow(value: number, series: ESeries = E24): number {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError('value must be a positive finite number');
  const target = clean(value);
  return Math.max(...candidates(decadeOf(value), series).filter((c) => c <= target));
}

/** Common through-hole and chip resistor power ratings, in watts. */
export const RESISTOR_WATTAGES = [0.125, 0.25, 0.5, 1, 2, 3, 5, 10, 25, 50] as const;

/** The smallest stock rating at or above `watts`, or null when even the largest is too small. */
export function wattageAtOrAbove(watts: number): number | null {
  return RESISTOR_WATTAGES.find((w) => w >= watts) ?? null;
}
