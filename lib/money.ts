// Money is integer minor units plus an ISO 4217 code. The exponent (digits after the point) comes
// from the runtime's ICU data, which follows ISO 4217 (e.g. USD/EUR 2, JPY 0, KWD 3).

export function minorUnitExponent(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

export function formatMoney(minor: number, currency: string, locale = 'en'): string {
  const exp = minorUnitExponent(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: exp, maximumFractionDigits: exp }).format(
    minor / 10 ** exp,
  );
}

/** Parses a typed amount ("12.5", "12,50") into minor units; null if it is not a valid amount. */
export function parseMoney(input: string, currency: string): number | null {
  const exp = minorUnitExponent(currency);
  const s = input.trim().replace(',', '.');
  const re = exp === 0 ? /^\d+$/ : new RegExp(`^\\d+(\\.\\d{1,${exp}})?$`);
  if (!re.test(s)) return null;
  const [whole, frac = ''] = s.split('.');
  return Number(whole) * 10 ** exp + Number((frac + '0'.repeat(exp)).slice(0, exp) || '0');
}

/** round(a / b) half away from zero, for a ≥ 0 and b > 0, exact in integers. */
export function divRoundHalfUp(a: bigint, b: bigint): bigint {
  return (2n * a + b) / (2n * b);
}

/**
 * What a line of `qty` (whole items, or metres/grams with at most three decimals) at `unitPriceMinor`
 * per unit comes to, in minor units: round(qty × price) HALF AWAY FROM ZERO (the rule the tax uses,
 * lib/sales/tax.ts), worked in integers (thousandths of a unit), so 2.5 m at 160 is exactly 400.
 */
export function lineAmountMinor(qty: number, unitPriceMinor: number): number {
  const thousandths = Math.round(qty * 1000);
  const sign = thousandths < 0 ? -1 : 1;
  return sign * Number(divRoundHalfUp(BigInt(Math.abs(thousandths)) * BigInt(unitPriceMinor), 1000n));
}

/** A shelf price in plain words: "$1.60 each" for single items, "$0.40 per metre" for anything sold by a measure. */
export function formatUnitPrice(minor: number, currency: string, saleUnit: string): string {
  const price = formatMoney(minor, currency);
  return !saleUnit || saleUnit === 'each' ? `${price} each` : `${price} per ${saleUnit}`;
}
