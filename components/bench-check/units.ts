// Display precision on the bench-check page comes from lib/electrical's formatters (V to 0.1, A to the
// mA, W to 0.01, °C to the degree, °C/W to 0.1). Two helpers the page needs on top.
import { formatQuantity } from '@/lib/electrical';

export const formatCelsius = (c: number) => formatQuantity(c, '°C');

/** "At most" advice rounds down, so the advice itself passes (2.46 → "2.4 °C/W"). Huge values read "any". */
export function sinkAtMost(r: number): string {
  if (!Number.isFinite(r)) return '—';
  if (r >= 1000) return 'any sink (even none would be near)';
  return `${(Math.floor(r * 10 + 1e-9) / 10).toFixed(1)} °C/W`;
}

/** A value and its limit at the unit's precision, with more decimals only when they would print alike. */
export function formatValueAndLimit(value: number, limit: number, unit: string): [string, string] {
  const scaleOf = Math.max(Math.abs(value), Math.abs(limit));
  let a = formatQuantity(value, unit, 0, scaleOf);
  let b = formatQuantity(limit, unit, 0, scaleOf);
  for (let extra = 1; a === b && value !== limit && extra <= 6; extra++) {
    a = formatQuantity(value, unit, extra, scaleOf);
    b = formatQuantity(limit, unit, extra, scaleOf);
  }
  return [a, b];
}
