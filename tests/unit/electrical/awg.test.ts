import { describe, expect, it } from 'vitest';
import { awgDiameterMm, awgOhmsPerMeter, loopOhms } from '@/lib/electrical';
import { awgName, suggestAwg } from '@/lib/electrical/wire';

describe('AWG diameter (ASTM B258)', () => {
  it('hits the two points that define the gauge', () => {
    // ASTM B258 / the AWG definition: 36 AWG is 0.005 in (0.127 mm), 0000 (written −3) is 0.46 in.
    expect(awgDiameterMm(36)).toBeCloseTo(0.127, 12);
    expect(awgDiameterMm(-3)).toBeCloseTo(0.46 * 25.4, 9);
  });

  it.each([
    // ASTM B258 table of nominal diameters, inches (from memory): 10 → 0.1019, 12 → 0.0808, 14 → 0.0641,
    // 18 → 0.0403, 22 → 0.0253, 24 → 0.0201.
    [10, 0.1019],
    [12, 0.0808],
    [14, 0.0641],
    [18, 0.0403],
    [22, 0.0253],
    [24, 0.0201],
  ])('%i AWG is %f in across', (awg, inches) => {
    expect(awgDiameterMm(awg) / 25.4).toBeCloseTo(inches, 4);
  });

  it('every 6 gauges halves the diameter, near enough (92^(6/39) ≈ 2.005)', () => {
    // Consequence of the ASTM B258 formula; the "6 gauges = half the diameter" rule is common practice (no source).
    expect(awgDiameterMm(12) / awgDiameterMm(18)).toBeCloseTo(2.005, 3);
  });
});

describe('copper resistance per metre (IEC 60028 resistivity, 20 °C)', () => {
  it.each([
    // Handbook table of annealed copper at 20 °C, Ω/km (from memory): 10 → 3.277, 12 → 5.211, 14 → 8.286,
    // 16 → 13.17, 18 → 20.95, 20 → 33.31, 22 → 52.96, 24 → 84.22, 26 → 133.9, 28 → 212.9.
    [10, 3.277],
    [12, 5.211],
    [14, 8.286],
    [16, 13.17],
    [18, 20.95],
    [20, 33.31],
    [22, 52.96],
    [24, 84.22],
    [26, 133.9],
    [28, 212.9],
  ])('%i AWG ≈ %f Ω/km', (awg, ohmsPerKm) => {
    // within 0.1 % of the table
    expect(Math.abs(awgOhmsPerMeter(awg) * 1000 - ohmsPerKm) / ohmsPerKm).toBeLessThan(0.001);
  });

  it('uses 1/58 Ω·mm²/m: a 1 mm² conductor would be 17.24 Ω/km', () => {
    // IEC 60028: annealed copper, 1/58 Ω·mm²/m = 0.017241 Ω·mm²/m.
    const area = (Math.PI * awgDiameterMm(17) ** 2) / 4;
    expect(awgOhmsPerMeter(17) * area).toBeCloseTo(0.017241, 6);
  });

  it('a two-wire run counts both conductors: 2 × length × Ω/m', () => {
    // Ohm's law for a series loop: out and back. 10 m of 18 AWG (20.95 Ω/km, from memory) ≈ 0.419 Ω.
    expect(loopOhms(10, 18)).toBeCloseTo(0.419, 3);
    expect(loopOhms(0, 18)).toBe(0);
  });
});

describe('gauge names and suggestions', () => {
  it('writes aught sizes the way the trade does', () => {
    // AWG naming: 0 is 1/0, −1 is 2/0, −3 is 4/0 (ASTM B258 gauge list).
    expect([awgName(-3), awgName(-1), awgName(0), awgName(1), awgName(18)]).toEqual(['4/0', '2/0', '1/0', '1', '18']);
  });

  it('suggests the thinnest gauge that keeps the drop within the limit', () => {
    // 1 A over 10 m one way, limit 0.5 V → loop ≤ 0.5 Ω → ≤ 25 Ω/km: 18 AWG (20.95) passes, 19 AWG (26.4) does not.
    const g = suggestAwg(10, (ohms) => ohms * 1, 0.5);
    expect(g).toBe(18);
    expect(loopOhms(10, 19) * 1).toBeGreaterThan(0.5);
  });

  it('says so when even 4/0 is not enough', () => {
    expect(suggestAwg(10_000, (ohms) => ohms * 100, 0.01)).toBeNull();
  });
});
