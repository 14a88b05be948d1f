// Units of measure (migration 0014): what a counted part is counted and sold in. Pure and without
// dependencies, so client components (counter, count screen, order lines) import it as they are.
import type { Measure } from '@/lib/domain';

export type { Measure };
export const MEASURES = ['each', 'metre', 'gram'] as const satisfies readonly Measure[];

/** At most three decimals: a millimetre of wire, a milligram of solder. */
export const MEASURE_DECIMALS = 3;

/** The short symbol after a quantity: "65.5 m", "250 g", and nothing after a number of items. */
export const MEASURE_SYMBOL: Record<Measure, string> = { each: '', metre: 'm', gram: 'g' };

/** How a price reads after the amount: "$0.40 each", "$1.60 per metre", "$0.12 per gram". */
export const PRICE_PER: Record<Measure, string> = { each: 'each', metre: 'per metre', gram: 'per gram' };

/** The choice on the part form, in plain words. */
export const MEASURE_CHOICES: Record<Measure, string> = {
  each: 'Whole items',
  metre: 'By the metre',
  gram: 'By the gram',
};

export const isMeasure = (v: unknown): v is Measure =>
  typeof v === 'string' && (MEASURES as readonly string[]).includes(v);

/** A stored unit read defensively: anything unknown is 'each'. */
export const measureOf = (v: string | null | undefined): Measure => (isMeasure(v) ? v : 'each');

/** Words people type for a unit ("m", "metres", "grams") read as ours; null when it is none of them. */
export function parseMeasure(input: string): Measure | null {
  const s = input
    .trim()
    .toLowerCase()
    .replace(/^per\s+/, '');
  if (['', 'each', 'ea', 'item', 'items', 'piece', 'pieces', 'pc', 'pcs'].includes(s)) return 'each';
  if (['m', 'metre', 'metres', 'meter', 'meters'].includes(s)) return 'metre';
  if (['g', 'gram', 'grams', 'gramme', 'grammes'].includes(s)) return 'gram';
  return null;
}

/** True when x has no more than three decimals (read in thousandths, so float noise does not count). */
export function hasAtMostThreeDecimals(x: number): boolean {
  return Number.isFinite(x) && Math.abs(x * 1000 - Math.round(x * 1000)) < 1e-6;
}

/** A quantity brought back to its three decimals after adding or taking away (0.1 + 0.2 is 0.3). */
export const roundQty = (x: number): number => Math.round(x * 1000) / 1000;

/** Sum of quantities, kept to three decimals. */
export const sumQty = (xs: number[]): number => roundQty(xs.reduce((a, b) => a + b, 0));

/**
 * Why a quantity does not fit the part's unit, or null when it does: whole items take whole numbers;
 * metres and grams take at most three decimals.
 */
export function qtyProblem(qty: number, measure: Measure): string | null {
  if (!Number.isFinite(qty)) return 'must be a number';
  if (measure === 'each')
    return Number.isInteger(qty) ? null : 'must be a whole number (this part is counted in whole items)';
  return hasAtMostThreeDecimals(qty)
    ? null
    : `may have at most ${MEASURE_DECIMALS} decimals (this part is counted in ${measure === 'metre' ? 'metres' : 'grams'})`;
}

/** "3", "65.5 m", "250 g": the quantity as people read it, up to three decimals, no trailing zeros. */
export function formatQty(qty: number, measure: Measure | string = 'each'): string {
  const n = new Intl.NumberFormat('en', { maximumFractionDigits: MEASURE_DECIMALS }).format(roundQty(qty));
  const symbol = MEASURE_SYMBOL[measureOf(measure)];
  return symbol ? `${n} ${symbol}` : n;
}

/** The input's `step`: whole items step by one; metres and grams take any thousandth. */
export const qtyStep = (measure: Measure | string): string => (measureOf(measure) === 'each' ? '1' : '0.001');

/** The input's keyboard on a phone: decimals get a decimal point. */
export const qtyInputMode = (measure: Measure | string): 'numeric' | 'decimal' =>
  measureOf(measure) === 'each' ? 'numeric' : 'decimal';

/** A typed quantity ("65,5" or "65.5") as a number; null when it is not one. */
export function parseQtyInput(input: string): number | null {
  const s = input.trim().replace(',', '.');
  if (!/^\d+(\.\d+)?$/.test(s)) return null;
  return Number(s);
}
