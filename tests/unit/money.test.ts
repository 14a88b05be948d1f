import { describe, expect, it } from 'vitest';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';

// Minor units of currencies, checked against ISO 4217 (the "Minor unit" column of the current
// currency code list, List One, maintained by the ISO 4217 maintenance agency, SIX Group):
// USD 2, EUR 2, JPY 0, KWD 3, BHD 3.
const ISO_4217_MINOR_UNITS: [string, number][] = [
  ['USD', 2],
  ['EUR', 2],
  ['JPY', 0],
  ['KWD', 3],
  ['BHD', 3],
];

describe('minor units per ISO 4217', () => {
  it.each(ISO_4217_MINOR_UNITS)('%s has %i digits after the point', (currency, exponent) => {
    expect(minorUnitExponent(currency)).toBe(exponent);
  });
});

describe('formatMoney', () => {
  // The same integer means a different amount in each currency: it is divided by 10^exponent.
  it.each([
    ['USD', 1234, '$12.34'],
    ['EUR', 1234, '€12.34'],
    ['JPY', 1234, '¥1,234'],
    ['KWD', 1234, 'KWD 1.234'],
    ['BHD', 1234, 'BHD 1.234'],
  ])('%s %i minor units → %s', (currency, minor, shown) => {
    // Intl may put a no-break space between code and amount; compare with ordinary spaces.
    expect(formatMoney(minor, currency).replace(/\u00a0/g, ' ')).toBe(shown);
  });

  it('always shows every minor digit, even when they are zero', () => {
    expect(formatMoney(500, 'USD')).toBe('$5.00');
    expect(formatMoney(5000, 'KWD').replace(/\u00a0/g, ' ')).toBe('KWD 5.000');
    expect(formatMoney(5, 'JPY')).toBe('¥5');
  });

  it('keeps single minor units exact (no floating-point drift)', () => {
    expect(formatMoney(1, 'USD')).toBe('$0.01');
    expect(formatMoney(1, 'BHD').replace(/\u00a0/g, ' ')).toBe('BHD 0.001');
    expect(formatMoney(999_999_999, 'EUR')).toBe('€9,999,999.99');
  });

  it('formats refunds and reversals as negative amounts', () => {
    expect(formatMoney(-250, 'USD')).toBe('-$2.50');
  });
});

describe('parseMoney', () => {
  it('reads typed amounts into minor units with the currency’s exponent', () => {
    expect(parseMoney('12.5', 'USD')).toBe(1250);
    expect(parseMoney('12,50', 'EUR')).toBe(1250);
    expect(parseMoney('1250', 'JPY')).toBe(1250);
    expect(parseMoney('1.234', 'KWD')).toBe(1234);
    expect(parseMoney('0.1', 'BHD')).toBe(100);
  });

  it('refuses more digits than the currency has, and anything that is not an amount', () => {
    expect(parseMoney('12.345', 'USD')).toBeNull();
    expect(parseMoney('12.5', 'JPY')).toBeNull();
    expect(parseMoney('1.2345', 'KWD')).toBeNull();
    expect(parseMoney('-3', 'USD')).toBeNull();
    expect(parseMoney('ten', 'EUR')).toBeNull();
    expect(parseMoney('', 'EUR')).toBeNull();
  });

  it('round-trips with formatMoney for every exponent', () => {
    for (const [currency] of ISO_4217_MINOR_UNITS) {
      for (const minor of [0, 1, 7, 10, 99, 100, 12345, 1_000_000]) {
        const shown = formatMoney(minor, currency).replace(/[^\d.]/g, '');
        expect(parseMoney(shown, currency)).toBe(minor);
      }
    }
  });
});
