import type { TaxMode } from '@/lib/domain';
import { divRoundHalfUp } from '@/lib/money';

// Tax on a sale, in integer minor units (ISO 4217 minor units of the sale's currency). Pure.
//
// The rounding rule: tax is worked out ONCE PER SALE on the sum of its lines (never per line), and
// rounded HALF AWAY FROM ZERO to the currency's minor unit (amounts here are never negative, so this is
// "half up": 16.5 cents is 17). Rates are whole hundredths of a percent (basis points: 825 = 8.25 %).
//   exclusive: shelf prices are before tax; tax = round(lines × rate), paid = lines + tax.
//   inclusive: shelf prices already hold the tax; paid = lines, tax = round(lines × rate / (1 + rate)).
//   exempt:    no tax; paid = lines.
// A refund gives back the sale's tax in proportion to the money it returns (refundTax, below), and all
// that is left of it when it returns all that is left, so a fully refunded sale returns its tax exactly.

export type TaxRule = { mode: TaxMode; rateBp: number };
export type TaxedTotal = { linesMinor: number; taxMinor: number; totalMinor: number; netMinor: number };

export const EXEMPT: TaxRule = { mode: 'exempt', rateBp: 0 };

export { divRoundHalfUp };

/** The tax and the amount to pay for a sale whose lines sum to `linesMinor`. */
export function taxSale(linesMinor: number, rule: TaxRule): TaxedTotal {
  if (!Number.isSafeInteger(linesMinor) || linesMinor < 0) throw new RangeError('lines must be a whole amount ≥ 0');
  const lines = BigInt(linesMinor);
  const bp = BigInt(rule.rateBp);
  if (rule.mode === 'exempt' || rule.rateBp === 0)
    return { linesMinor, taxMinor: 0, totalMinor: linesMinor, netMinor: linesMinor };
  if (rule.mode === 'exclusive') {
    const tax = Number(divRoundHalfUp(lines * bp, 10_000n));
    return { linesMinor, taxMinor: tax, totalMinor: linesMinor + tax, netMinor: linesMinor };
  }
  const tax = Number(divRoundHalfUp(lines * bp, 10_000n + bp));
  return { linesMinor, taxMinor: tax, totalMinor: linesMinor, netMinor: linesMinor - tax };
}

/** What the buyer pays back for lines worth `linesMinor` at shelf prices, under the sale's own rule. */
export function refundAmountForLines(linesMinor: number, rule: TaxRule): number {
  return taxSale(linesMinor, rule).totalMinor;
}

/**
 * The tax inside a refund of `amountMinor` on a sale that took `saleTaxMinor` of tax in `saleTotalMinor`,
 * when `taxLeftMinor` of that tax has not been given back yet: all of it when the refund returns all that
 * is left (`isAllLeft`), otherwise the sale's share, rounded half up, never more than is left.
 */
export function refundTax(input: {
  amountMinor: number;
  saleTotalMinor: number;
  saleTaxMinor: number;
  taxLeftMinor: number;
  isAllLeft: boolean;
}): number {
  if (input.saleTaxMinor <= 0 || input.saleTotalMinor <= 0) return 0;
  if (input.isAllLeft) return Math.max(0, input.taxLeftMinor);
  const share = Number(
    divRoundHalfUp(BigInt(input.amountMinor) * BigInt(input.saleTaxMinor), BigInt(input.saleTotalMinor)),
  );
  return Math.max(0, Math.min(share, input.taxLeftMinor, input.amountMinor));
}

/** "8.25 %" from 825 basis points. */
export function formatRate(rateBp: number): string {
  const whole = Math.floor(rateBp / 100);
  const frac = String(rateBp % 100).padStart(2, '0').replace(/0+$/, '');
  return `${whole}${frac ? `.${frac}` : ''} %`;
}

/** The receipt's words for a sale's tax: "Sales tax 8.25 % (added)", "VAT 20 % (included)". */
export function taxWords(name: string, rule: TaxRule): string {
  if (rule.mode === 'exempt') return 'No tax';
  return `${name} ${formatRate(rule.rateBp)} (${rule.mode === 'inclusive' ? 'included in the prices' : 'added to the prices'})`;
}

/**
 * The lines a receipt shows around its total, in order: exclusive tax shows the subtotal and the tax
 * before the total; inclusive tax names the tax inside the total after it; no tax shows nothing.
 */
export function receiptTaxLines(input: {
  name: string;
  mode: TaxMode;
  rateBp: number;
  taxMinor: number;
  totalMinor: number;
}): { before: { label: string; minor: number }[]; after: { label: string; minor: number }[] } {
  if (input.mode === 'exempt') return { before: [], after: [] };
  const rate = `${input.name} ${formatRate(input.rateBp)}`;
  if (input.mode === 'exclusive')
    return {
      before: [
        { label: 'Subtotal', minor: input.totalMinor - input.taxMinor },
        { label: rate, minor: input.taxMinor },
      ],
      after: [],
    };
  return { before: [], after: [{ label: `Includes ${rate}`, minor: input.taxMinor }] };
}

/**
 * Spreads a sale's tax over its lines for line-by-line books, so each line has its own net, tax and
 * gross and the lines still add up to the sale exactly. Shares are in proportion to the lines' shelf
 * amounts, by the largest remainder method (Hamilton's method): every line gets the whole part of its
 * share, then the cents left over go one each to the lines with the largest fractions (ties: first line).
 */
export function allocateTax(lineAmounts: number[], taxMinor: number): number[] {
  const total = lineAmounts.reduce((a, b) => a + b, 0);
  if (taxMinor === 0 || total === 0) return lineAmounts.map(() => 0);
  const T = BigInt(taxMinor);
  const A = BigInt(total);
  const shares = lineAmounts.map((a, i) => {
    const num = T * BigInt(a);
    return { i, whole: num / A, rest: num % A };
  });
  let left = T - shares.reduce((s, x) => s + x.whole, 0n);
  const order = [...shares].sort((x, y) => (y.rest > x.rest ? 1 : y.rest < x.rest ? -1 : x.i - y.i));
  const out = shares.map((x) => x.whole);
  for (const x of order) {
    if (left <= 0n) break;
    out[x.i] += 1n;
    left -= 1n;
  }
  return out.map(Number);
}
