import { describe, expect, it } from 'vitest';
import { buckDuty, buckRippleAmps, resistorAmps, stringVolts, supplyWindow } from '@/lib/electrical';
import { constantPowerInputVolts, worstBuckRippleAmps } from '@/lib/electrical/circuit';

describe('buck power stage', () => {
  it('duty with losses: D = Vout / (Vin × η)', () => {
    // TI application report SLVA477, "Basic Calculation of a Buck Converter's Power Stage": duty cycle
    // D = Vout / (Vin × η). Worked by hand: 5 V out of 12 V at 90 % → 5 / 10.8 = 0.46296.
    expect(buckDuty(5, 12, 0.9)).toBeCloseTo(0.462963, 6);
  });

  it('lossless duty is the ideal conversion ratio M(D) = D = V / Vg', () => {
    // Erickson & Maksimović, Fundamentals of Power Electronics, ch. 2: the ideal buck has V = D × Vg.
    expect(buckDuty(18, 24, 1)).toBeCloseTo(0.75, 12);
  });

  it('inductor ripple: ΔI = (Vin − Vout) × D / (fs × L)', () => {
    // TI SLVA477: ΔIL = (Vin − Vout) × D / (fs × L), D from the same Vin.
    // By hand: (12 − 5) × 0.462963 / (500 kHz × 22 µH) = 3.24074 / 11 = 0.294613 A.
    expect(buckRippleAmps(12, 5, 0.9, 22e-6, 500e3)).toBeCloseTo(0.294613, 5);
  });

  it('matches the textbook peak-to-peak ripple when lossless', () => {
    // Erickson & Maksimović ch. 2: 2ΔiL = (Vg − V) × D × Ts / L (their ΔiL is half the peak-to-peak).
    // 24 V → 12 V, D = 0.5, Ts = 10 µs, L = 100 µH: 2ΔiL = 12 × 0.5 × 10e-6 / 100e-6 = 0.6 A.
    expect(buckRippleAmps(24, 12, 1, 100e-6, 100e3)).toBeCloseTo(0.6, 12);
  });

  it('worst ripple over a string range peaks at Vout = Vin / 2 when that is inside the range', () => {
    // (Vin − Vo) × Vo is a downward parabola with its top at Vin / 2 (algebra on the SLVA477 formula).
    const mid = worstBuckRippleAmps(24, { min: 10, max: 14 }, 1, 100e-6, 100e3);
    expect(mid).toBeCloseTo(buckRippleAmps(24, 12, 1, 100e-6, 100e3), 12);
    const edge = worstBuckRippleAmps(24, { min: 14, max: 16 }, 1, 100e-6, 100e3);
    expect(edge).toBeCloseTo(buckRippleAmps(24, 14, 1, 100e-6, 100e3), 12);
  });
});

describe('supply window and string', () => {
  it('a ±5 % 24 V supply spans 22.8 to 25.2 V', () => {
    // Definition of a ± percentage tolerance on a nominal value.
    const w = supplyWindow({ volts: 24, tolerancePct: 5 });
    expect(w.low).toBeCloseTo(22.8, 12);
    expect(w.high).toBeCloseTo(25.2, 12);
  });

  it('series forward voltages add', () => {
    // Kirchhoff's voltage law around a series loop (Horowitz & Hill, The Art of Electronics, ch. 1).
    const s = stringVolts({ count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4 } });
    expect(s.min).toBeCloseTo(16.8, 12);
    expect(s.typ).toBeCloseTo(18, 12);
    expect(s.max).toBeCloseTo(20.4, 12);
  });
});

describe('series resistor current', () => {
  it('I = (V − N × Vf) / R, and zero when the string is not lit', () => {
    // Ohm's law across the resistor with KVL around the loop (Horowitz & Hill ch. 1). 12 V, 9 V string, 150 Ω → 20 mA.
    expect(resistorAmps(12, 9, 150)).toBeCloseTo(0.02, 12);
    expect(resistorAmps(8, 9, 150)).toBe(0);
  });
});

describe('constant-power load fed through a wire', () => {
  it('settles where Ohm\'s law and P = V × I agree', () => {
    // Ohm's law: I = (Vs − V) / R; the load takes P = V × I. Check the returned V satisfies both.
    const vs = 24;
    const r = 0.5;
    const p = 40;
    const { volts, collapsed } = constantPowerInputVolts(vs, r, p);
    expect(collapsed).toBe(false);
    expect((volts * (vs - volts)) / r).toBeCloseTo(p, 9);
    // the larger root: the driver runs near the supply, not near zero
    expect(volts).toBeGreaterThan(vs / 2);
  });

  it('reports when the wire cannot carry that power (4RP > Vs²)', () => {
    // Maximum power transfer through a series resistance is Vs² / (4R) (Horowitz & Hill ch. 1).
    expect(constantPowerInputVolts(24, 1, 144).collapsed).toBe(false); // exactly Vs² / 4R
    expect(constantPowerInputVolts(24, 1, 144.01)).toEqual({ volts: 12, collapsed: true });
  });

  it('no wire, no drop', () => {
    expect(constantPowerInputVolts(24, 0, 40)).toEqual({ volts: 24, collapsed: false });
  });
});
