import { describe, expect, it } from 'vitest';
import { checkKit } from '@/lib/electrical';
import { buckSpec, checkOf } from './fixtures';

// Base: 4 LEDs of 2.8 / 3.0 / 3.2 V → string 11.2 / 12.0 / 12.8 V; buck 6–36 V in, 350 mA, headroom 1.5 V,
// max duty 0.95, η 0.90; supply tolerance 0 unless a test sets it.
const verdictOf = (spec: Parameters<typeof checkKit>[0], id: Parameters<typeof checkOf>[1]) => checkOf(checkKit(spec), id).verdict;

describe('buck: supply against the driver input range (contract rule)', () => {
  it('high end at the rating is ok, above it fails', () => {
    expect(verdictOf(buckSpec({ supply: { volts: 36 } }), 'supply-vs-driver-max')).toBe('ok');
    expect(verdictOf(buckSpec({ supply: { volts: 36.01 } }), 'supply-vs-driver-max')).toBe('fail');
  });

  it('the tolerance band counts: 34.28 V ±5 % reaches 35.99 V, 34.29 V reaches 36.0045 V', () => {
    expect(verdictOf(buckSpec({ supply: { volts: 34.28, tolerancePct: 5 } }), 'supply-vs-driver-max')).toBe('ok');
    const r = checkKit(buckSpec({ supply: { volts: 34.29, tolerancePct: 5 } }));
    const c = checkOf(r, 'supply-vs-driver-max');
    expect(c.verdict).toBe('fail');
    expect(c.value).toBeCloseTo(36.0045, 9);
    expect(c.limit).toBe(36);
    expect(c.unit).toBe('V');
    // says what to change, with numbers
    expect(c.message).toContain('a driver rated for at least 36.1 V in');
    expect(c.message).toContain('a supply of at most 34.2 V');
    expect(r.verdict).toBe('fail');
  });

  it('low end at the minimum input is ok, under it fails', () => {
    expect(verdictOf(buckSpec({ supply: { volts: 20 }, driver: { minInputVolts: 20 } }), 'supply-vs-driver-min')).toBe('ok');
    const c = checkOf(checkKit(buckSpec({ supply: { volts: 19.9 }, driver: { minInputVolts: 20 } })), 'supply-vs-driver-min');
    expect(c.verdict).toBe('fail');
    expect(c.message).toContain('at least 20.0 V');
  });
});

describe('buck: headroom (contract rule: fail under typ + headroom, caution under max + headroom)', () => {
  // needs 12.0 + 1.5 = 13.5 V for typical LEDs, 12.8 + 1.5 = 14.3 V for worst-case ones
  it.each([
    [14.3, 'ok'],
    [14.29, 'caution'],
    [13.5, 'caution'],
    [13.49, 'fail'],
  ] as const)('%f V → %s', (volts, verdict) => {
    expect(verdictOf(buckSpec({ supply: { volts } }), 'headroom')).toBe(verdict);
  });

  it('the supply low end is what counts: 15 V −5 % = 14.25 V → caution', () => {
    const c = checkOf(checkKit(buckSpec({ supply: { volts: 15, tolerancePct: 5 } })), 'headroom');
    expect(c.verdict).toBe('caution');
    expect(c.value).toBeCloseTo(14.25, 12);
    expect(c.limit).toBeCloseTo(14.3, 12);
    // 14.3 / 0.95 = 15.05 → "at least 15.1 V"
    expect(c.message).toContain('a supply of at least 15.1 V');
  });

  it('a failing headroom suggests a supply and how many LEDs this one can drive', () => {
    const c = checkOf(checkKit(buckSpec({ supply: { volts: 12 }, count: 4 })), 'headroom');
    expect(c.verdict).toBe('fail');
    expect(c.message).toContain('a supply of at least 14.3 V');
    // (12 − 1.5) / 3.2 = 3.28 → 3 LEDs
    expect(c.message).toContain('at most 3 LEDs');
  });

  it('uses the driver headroom given', () => {
    expect(verdictOf(buckSpec({ supply: { volts: 14.3 }, driver: { headroomVolts: 2 } }), 'headroom')).toBe('caution');
  });
});

describe('buck: duty cycle D = Vstring / (Vin × η) against maxDuty', () => {
  // TI SLVA477 duty formula. Typical: 12 / (V × 0.9) ≤ 0.95 ⇔ V ≥ 14.035 V;
  // worst case: 12.8 / (V × 0.9) ≤ 0.95 ⇔ V ≥ 14.971 V.
  it.each([
    [15, 'ok'],
    [14.96, 'caution'],
    [14.04, 'caution'],
    [14.03, 'fail'],
  ] as const)('%f V → %s', (volts, verdict) => {
    expect(verdictOf(buckSpec({ supply: { volts } }), 'duty')).toBe(verdict);
  });

  it('reports the worst-case duty as value and figure', () => {
    const r = checkKit(buckSpec({ supply: { volts: 16 } }));
    expect(checkOf(r, 'duty').value).toBeCloseTo(12.8 / (16 * 0.9), 12);
    expect(r.figures.duty).toBeCloseTo(12.8 / (16 * 0.9), 12);
    expect(checkOf(r, 'duty').limit).toBe(0.95);
    expect(checkOf(r, 'duty').unit).toBe('ratio');
  });
});

describe('buck: maximum output voltage (contract rule)', () => {
  it('string max at the limit is ok, above it fails', () => {
    expect(verdictOf(buckSpec({ driver: { maxOutputVolts: 12.8 } }), 'driver-max-output')).toBe('ok');
    const c = checkOf(checkKit(buckSpec({ driver: { maxOutputVolts: 12.79 } })), 'driver-max-output');
    expect(c.verdict).toBe('fail');
    // 12.79 / 3.2 = 3.99 → 3 LEDs
    expect(c.message).toContain('at most 3 LEDs');
  });

  it('is left out when the driver has no stated limit', () => {
    expect(checkKit(buckSpec()).checks.map((c) => c.id)).not.toContain('driver-max-output');
  });
});

describe('buck: inductor ripple', () => {
  // Worst case at the supply high end (24 V); Vin / 2 = 12 V lies in 11.2–12.8 V, so Vo = 12 V:
  // ΔI = (24 − 12) × 12 / (24 × 0.9) / (L × 100 kHz) = 6.6667e-5 / L (TI SLVA477).
  it('figure follows the formula', () => {
    const r = checkKit(buckSpec({ driver: { inductorHenries: 470e-6, switchingHz: 100e3 } }));
    expect(r.figures.rippleAmps).toBeCloseTo(6.6667e-5 / 470e-6, 4);
  });

  it('cautions above 40 % of the output current (0.14 A of 0.35 A)', () => {
    // TI SLVA477 suggests a ripple of 20–40 % of the output current (from memory).
    expect(verdictOf(buckSpec({ driver: { inductorHenries: 480e-6, switchingHz: 100e3 } }), 'ripple')).toBe('ok');
    expect(verdictOf(buckSpec({ driver: { inductorHenries: 470e-6, switchingHz: 100e3 } }), 'ripple')).toBe('caution');
  });

  it('needs both the inductance and the frequency', () => {
    const r = checkKit(buckSpec({ driver: { inductorHenries: 470e-6 } }));
    expect(r.figures.rippleAmps).toBeUndefined();
    expect(r.checks.map((c) => c.id)).not.toContain('ripple');
  });
});

describe('buck: figures', () => {
  it('power, efficiency and supply current follow P_in = P_out / η, I = P_in / V_low', () => {
    const r = checkKit(buckSpec({ supply: { volts: 24 }, driver: { outputAmps: 1 }, led: { maxAmps: 2 } }));
    // Worst case: P_out = S_max × I = 12.8 V × 1 A = 12.8 W; P_in = 12.8 / 0.9 = 14.222 W;
    // I = 14.222 / 24 = 0.59259 A (energy balance of a buck, TI SLVA477).
    expect(r.figures.outputWatts).toBeCloseTo(12.8, 12);
    expect(r.figures.inputWatts).toBeCloseTo(14.2222, 4);
    expect(r.figures.lossWatts).toBeCloseTo(1.4222, 4);
    expect(r.figures.supplyAmps).toBeCloseTo(0.59259, 5);
    expect(r.figures.efficiency).toBe(0.9);
    expect(r.figures.ledAmpsPeak).toBe(1);
    expect(r.figures.ledWatts).toBeCloseTo(3.2, 12);
    expect(r.figures).toMatchObject({ stringVoltsMin: expect.closeTo(11.2, 9), stringVoltsTyp: 12, stringVoltsMax: 12.8 });
  });

  it('a safe build is ok all through', () => {
    const r = checkKit(buckSpec({ supply: { volts: 24 } }));
    expect(r.verdict).toBe('ok');
    expect(r.checks.every((c) => c.verdict === 'ok')).toBe(true);
    expect(r.checks.map((c) => c.id)).toEqual([
      'low-voltage-limit',
      'supply-vs-driver-max',
      'supply-vs-driver-min',
      'headroom',
      'duty',
      'led-current',
      'led-power',
      'supply-current',
      'led-junction',
    ]);
  });
});
