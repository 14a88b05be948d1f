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

/** A shelf price in plain words: "$1.60 each" for single items, "$0.40 per metre" for anything sold by a measure. */
export function formatUnitPrice(minor: number, currency: string, saleUnit: string): string {
  const price = formatMoney(minor, currency);
  return !saleUnit || saleUnit === 'each' ? `${price} each` : `${price} per ${saleUnit}`;
}
