import { describe, expect, it } from 'vitest';
import { formatAmps, formatCelsius, formatPair, formatPercent, formatQuantity, formatSi, formatVolts, formatWatts } from '@/lib/electrical';
import { ceilTo, floorTo } from '@/lib/electrical/format';

// Display precision is a product rule (PRODUCT.md): V to 0.1, A to the mA, W to 0.01.
describe('figures for people', () => {
  it('volts to 0.1 V', () => {
    expect(formatVolts(18.26)).toBe('18.3 V');
    expect(formatVolts(25.200000000000003)).toBe('25.2 V');
    expect(formatVolts(-0.01)).toBe('0.0 V');
  });

  it('amps to the milliamp', () => {
    expect(formatAmps(0.35)).toBe('350 mA');
    expect(formatAmps(0.0004)).toBe('0 mA');
    expect(formatAmps(1.05)).toBe('1.050 A');
  });

  it('watts to 0.01 W, ratios as percent', () => {
    expect(formatWatts(0.5249999999)).toBe('0.52 W');
    expect(formatWatts(3)).toBe('3.00 W');
    expect(formatPercent(0.8771)).toBe('87.7 %');
  });

  it('SI prefixes for the rest', () => {
    expect(formatSi(4700, 'Ω')).toBe('4.7 kΩ');
    expect(formatSi(68e-6, 'H')).toBe('68 µH');
    expect(formatSi(300e3, 'Hz')).toBe('300 kHz');
    expect(formatSi(0, 'Ω')).toBe('0 Ω');
    expect(formatQuantity(0.95, 'ratio')).toBe('95.0 %');
    expect(formatQuantity(Number.NaN, 'V')).toBe('—');
  });

  it('rounds advice the safe way, ignoring float dust', () => {
    expect(ceilTo(18.26, 0.1)).toBe(18.3);
    expect(ceilTo(18.3, 0.1)).toBe(18.3);
    expect(ceilTo(0.1 + 0.2, 0.1)).toBe(0.3);
    expect(floorTo(34.2857, 0.1)).toBe(34.2);
    expect(floorTo(34.3, 0.1)).toBe(34.3);
  });
});

describe('a value beside its limit', () => {
  // The contract's rule: when a verdict depends on the difference, the two never print the same.
  it('adds decimals until two different numbers read apart', () => {
    expect(formatPair(13.49, 13.5, 'V')).toEqual(['13.49 V', '13.50 V']);
    expect(formatPair(13.4999, 13.5, 'V')).toEqual(['13.4999 V', '13.5000 V']);
    expect(formatPair(24, 36, 'V')).toEqual(['24.0 V', '36.0 V']);
    expect(formatPair(3.004, 3, 'W')).toEqual(['3.004 W', '3.000 W']);
    expect(formatPair(0.9501, 0.95, 'ratio')).toEqual(['95.01 %', '95.00 %']);
    expect(formatPair(100.4, 100, '°C')).toEqual(['100.4 °C', '100.0 °C']);
    expect(formatPair(10.04, 10, 'A/mm²')).toEqual(['10.04 A/mm²', '10.00 A/mm²']);
  });

  it('prints both currents in one unit, chosen by the larger', () => {
    expect(formatPair(0.9999, 1, 'A')).toEqual(['0.9999 A', '1.0000 A']);
    expect(formatPair(0.35, 0.7, 'A')).toEqual(['350 mA', '700 mA']);
    expect(formatPair(0.35, 1, 'A')).toEqual(['0.350 A', '1.000 A']);
  });

  it('never prints a non-zero number as zero', () => {
    expect(formatPair(0.249, 0.0001, 'A')).toEqual(['249.0 mA', '0.1 mA']);
    expect(formatPair(0, 0.5, 'V')).toEqual(['0.0 V', '0.5 V']);
  });

  it('leaves numbers equal within the tolerance alike (the check treats them as equal)', () => {
    expect(formatPair(3 * 3.2, 9.6, 'V')).toEqual(['9.6 V', '9.6 V']);
  });

  it('temperatures to the degree, extra digits on request', () => {
    expect(formatCelsius(80.6)).toBe('81 °C');
    expect(formatCelsius(80.64, 1)).toBe('80.6 °C');
    expect(formatCelsius(Infinity)).toBe('—');
    expect(formatQuantity(2.25, '°C/W')).toBe('2.3 °C/W');
    expect(formatQuantity(Number.NaN, 'A/mm²')).toBe('—');
    expect(formatSi(1234, 'Ω', 2)).toBe('1.234 kΩ');
    expect(formatAmps(0.35, 1)).toBe('350.0 mA');
    expect(formatAmps(0.35, 0, 2)).toBe('0.350 A');
    expect(formatVolts(12.345, 2)).toBe('12.345 V');
    expect(formatWatts(1.2346, 1)).toBe('1.235 W');
    expect(formatPercent(0.12345, 1)).toBe('12.35 %');
  });
});

describe('edges of the display rules', () => {
  // The display precision is the product's own rule (common practice (no source)); these pin its edges.
  it('a negative number that rounds to zero prints as zero, any other negative keeps its sign', () => {
    expect(formatVolts(-0.04)).toBe('0.0 V');
    expect(formatWatts(-0.001)).toBe('0.00 W');
    expect(formatAmps(-0.0001)).toBe('0 mA');
    expect(formatVolts(-0.5)).toBe('-0.5 V');
    expect(formatVolts(-10.04)).toBe('-10.0 V');
  });

  it('amps from 1 A up, by size whatever the sign', () => {
    expect(formatAmps(1)).toBe('1.000 A');
    expect(formatAmps(0.999)).toBe('999 mA');
    expect(formatAmps(-2)).toBe('-2.000 A');
    expect(formatAmps(-0.5)).toBe('-500 mA');
  });

  it('SI prefixes: the unit of the larger number, switching where rounding would reach 1000', () => {
    expect(formatSi(0, 'Ω', 0, 1000)).toBe('0 kΩ');
    expect(formatSi(999.6, 'Ω')).toBe('1 kΩ');
    expect(formatSi(999, 'Ω')).toBe('999 Ω');
    expect(formatSi(-4700, 'Ω')).toBe('-4.7 kΩ');
    expect(formatSi(2.5e9, 'Hz')).toBe('2.5 GHz');
    // below the smallest prefix, still in nano
    expect(formatSi(1e-12, 'F')).toBe('0.001 nF');
  });

  it('each unit of a check by its own rule', () => {
    expect(formatQuantity(18.26, 'V')).toBe('18.3 V');
    expect(formatQuantity(0.35, 'A')).toBe('350 mA');
    expect(formatQuantity(1.234, 'W')).toBe('1.23 W');
    expect(formatQuantity(80.6, '°C')).toBe('81 °C');
    expect(formatQuantity(4.04, 'A/mm²')).toBe('4.0 A/mm²');
    expect(formatQuantity(4700, 'Ω')).toBe('4.7 kΩ');
  });

  it('asked for more decimals than a number can print, it prints the most it can', () => {
    expect(formatVolts(1.5, 150)).toBe(`${(1.5).toFixed(100)} V`);
    expect(formatSi(1.5, 'Ω', 150)).toBe('1.5 Ω');
  });

  it('a pair of equal numbers prints alike, zero and negative ones too', () => {
    expect(formatPair(0, 0, 'V')).toEqual(['0.0 V', '0.0 V']);
    expect(formatPair(-3 * 3.2, -9.6, 'V')).toEqual(['-9.6 V', '-9.6 V']);
  });

  it('gives up after 20 extra decimals', () => {
    const zeros = `0.${'0'.repeat(21)} V`;
    expect(formatPair(1e-25, 0, 'V')).toEqual([zeros, zeros]);
  });
});
