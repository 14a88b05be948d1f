import { describe, expect, it } from 'vitest';
import { formatAmps, formatPercent, formatQuantity, formatSi, formatVolts, formatWatts } from '@/lib/electrical';
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
