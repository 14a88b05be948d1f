// Every number of the version-2 rules with its source beside it, and threshold cases on both sides of
// each limit (a value exactly at a limit sits on its passing side: relative tolerance 1e-9).
import { describe, expect, it } from 'vitest';
import { type KitSpec, awgAreaMm2, checkKit, constantPowerDraw, kitSpecSchema } from '@/lib/electrical';
import { buckSpec, checkOf, linearSpec, resistorSpec } from './fixtures';

describe('rule 1: low-voltage limit, 60 V ripple-free DC (IEC 61140, IEC 60598-1 SELV; from memory)', () => {
  it.each([
    [60, 0, 'ok'],
    [60.0001, 0, 'fail'],
    // the high end counts: 57.14 V + 5 % = 59.997 V, 57.15 V + 5 % = 60.0075 V
    [57.14, 5, 'ok'],
    [57.15, 5, 'fail'],
  ] as const)('%f V ±%f %% → %s', (volts, tolerancePct, verdict) => {
    const c = checkOf(checkKit(buckSpec({ supply: { volts, tolerancePct }, driver: { maxInputVolts: 100 } })), 'low-voltage-limit');
    expect(c.verdict).toBe(verdict);
    expect(c.limit).toBe(60);
  });

  it('applies to every driver type', () => {
    for (const spec of [linearSpec({ supply: { volts: 61 } }), resistorSpec({ supply: { volts: 61 } })])
      expect(checkOf(checkKit(spec), 'low-voltage-limit').verdict).toBe('fail');
  });

  it('tells the member the build is out of scope, and prints the two numbers apart', () => {
    const c = checkOf(checkKit(buckSpec({ supply: { volts: 60.01 }, driver: { maxInputVolts: 100 } })), 'low-voltage-limit');
    expect(c.message).toMatch(/60\.01 V/);
    expect(c.message).toMatch(/60\.00 V DC/);
    expect(c.message).toMatch(/outside this bench's low-voltage scope/);
  });
});

// 4 LEDs of 3 V on 24 V ±0 % through a 1 A buck with η = 1: ΔI = (24 − 12) × 0.5 / (L × f) = 6 / (L f)
// (TI SLVA477, inductor ripple of a buck).
const ripple = (henries: number, hz: number, led: Partial<KitSpec['string']['led']> = {}, sat?: number): KitSpec => ({
  supply: { volts: 24, tolerancePct: 0, maxAmps: 10 },
  driver: {
    type: 'buck',
    minInputVolts: 6,
    maxInputVolts: 36,
    outputAmps: 1,
    efficiency: 1,
    inductorHenries: henries,
    switchingHz: hz,
    ...(sat !== undefined ? { inductorSatAmps: sat } : {}),
  },
  string: { count: 4, led: { vfMin: 3, vfTyp: 3, vfMax: 3, maxAmps: 5, maxWatts: 20, ...led } },
  heatSink: { count: 4, cPerW: 1 },
});

describe('rule 2: ripple peak I_set + ΔI / 2 (TI SLVA477)', () => {
  it('ripple at 40 % of I_set is ok, above it a caution (40 %: common practice (no source))', () => {
    // 6 / (50 µH × 300 kHz) = 0.4 A; 6 / (49 µH × 300 kHz) = 0.408 A
    expect(checkOf(checkKit(ripple(50e-6, 300e3)), 'ripple').verdict).toBe('ok');
    expect(checkOf(checkKit(ripple(49e-6, 300e3)), 'ripple').verdict).toBe('caution');
  });

  it('ΔI at 2 × I_set: caution naming continuous conduction; just under: caution for size only', () => {
    // 6 / (30 µH × 100 kHz) = 2 A; 6 / (30.1 µH × 100 kHz) = 1.993 A
    const at = checkOf(checkKit(ripple(30e-6, 100e3)), 'ripple');
    expect(at.verdict).toBe('caution');
    expect(at.message).toMatch(/leaves continuous conduction/);
    const under = checkOf(checkKit(ripple(30.1e-6, 100e3)), 'ripple');
    expect(under.verdict).toBe('caution');
    expect(under.message).not.toMatch(/continuous conduction/);
  });

  it('without the inductance or the frequency the peak is the set current', () => {
    const r = checkKit(buckSpec({ driver: { inductorHenries: 50e-6 } }));
    expect(r.figures.ledAmpsPeak).toBe(0.35);
    expect(r.figures.rippleAmps).toBeUndefined();
  });

  it('the worst ripple is at the supply high end (the window counts)', () => {
    const spec = ripple(50e-6, 300e3);
    const wide = checkKit({ ...spec, supply: { ...spec.supply, tolerancePct: 10 } });
    // at 26.4 V: (26.4 − 12) × 12 / 26.4 / 15 = 0.43636 A
    expect(wide.figures.rippleAmps).toBeCloseTo(((26.4 - 12) * 12) / 26.4 / 15, 12);
  });
});

describe('rule 3: LED peak current and inductor saturation against I_peak', () => {
  // peak = 1 + 0.4 / 2 = 1.2 A
  it.each([
    [1.2, 'ok'],
    [1.199, 'fail'],
  ] as const)('LED rated %f A → %s', (maxAmps, verdict) => {
    expect(checkOf(checkKit(ripple(50e-6, 300e3, { maxAmps })), 'led-current').verdict).toBe(verdict);
  });

  it.each([
    [1.2, 'ok'],
    [1.199, 'fail'],
  ] as const)('inductor saturating at %f A → %s', (sat, verdict) => {
    const c = checkOf(checkKit(ripple(50e-6, 300e3, {}, sat)), 'inductor-saturation');
    expect(c.verdict).toBe(verdict);
    expect(c.value).toBeCloseTo(1.2, 12);
    if (verdict === 'fail') expect(c.message).toContain('at least 1.200 A');
  });

  it('without a saturation rating there is no inductor check', () => {
    expect(checkKit(ripple(50e-6, 300e3)).checks.map((c) => c.id)).not.toContain('inductor-saturation');
  });

  it('an LED current failure from ripple alone suggests less ripple', () => {
    const c = checkOf(checkKit(ripple(50e-6, 300e3, { maxAmps: 1.1 })), 'led-current');
    expect(c.message).toMatch(/larger inductor/);
  });
});

describe('rule 5: a buck through a wire run is a constant-power load', () => {
  // I × (V_low − I × R) = P_in, the smaller root: I = (V − √(V² − 4RP)) / 2R (quadratic formula).
  const spec = buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters: 5, awg: 24 }, pwmDuty: 0.5 });
  const R = 2 * 5 * (1 / 58 / awgAreaMm2(24)); // ASTM B258 area, IEC 60028 copper 1/58 Ω·mm²/m
  const root = (P: number) => (24 - Math.sqrt(24 * 24 - 4 * R * P)) / (2 * R);

  it('the average supply current is the root for the average power', () => {
    const r = checkKit(spec);
    expect(r.figures.supplyAmps).toBeCloseTo(root((12.8 * 0.5) / 0.9), 12);
    expect(constantPowerDraw(24, R, 7).amps).toBeCloseTo(root(7), 12);
  });

  it('rule 10: the driver sees V_low − I_on × R, with I_on for the LEDs on (PWM aside)', () => {
    const r = checkKit(spec);
    const iOn = root(12.8 / 0.9);
    expect(r.figures.wireDropVolts).toBeCloseTo(iOn * R, 12);
    expect(checkOf(r, 'headroom').value).toBeCloseTo(24 - iOn * R, 12);
    expect(checkOf(r, 'supply-vs-driver-min').value).toBeCloseTo(24 - iOn * R, 12);
    expect(r.figures.duty).toBeCloseTo(12.8 / ((24 - iOn * R) * 0.9), 12);
  });

  it('duty (TI SLVA477 D = Vout / (Vin × η)): fail on typical LEDs, caution on worst-case ones, at the driver', () => {
    // with 3 m of 30 AWG the drop pushes the duty over 0.95 for the worst case only
    const at = (lengthMeters: number) =>
      checkOf(checkKit(buckSpec({ supply: { volts: 15.5 }, wiring: { lengthMeters, awg: 30 } })), 'duty').verdict;
    expect(at(0.01)).toBe('ok');
    expect(at(3)).toBe('caution');
    expect(at(12)).toBe('fail');
  });
});

describe('rule 6: wire current density I_on / area (ASTM B258 diameter; 4 and 10 A/mm²: common practice (no source))', () => {
  const area = awgAreaMm2(24); // 0.2047 mm²
  const at = (amps: number) =>
    checkOf(
      checkKit(linearSpec({ driver: { outputAmps: amps }, count: 1, led: { maxAmps: 5, maxWatts: 20 }, wiring: { lengthMeters: 0.1, awg: 24 } })),
      'wire-current-density',
    );
  it.each([
    [4, 'ok'],
    [4.01, 'caution'],
    [10, 'caution'],
    [10.01, 'fail'],
  ] as const)('%f A/mm² → %s', (density, verdict) => {
    const c = at(density * area);
    expect(c.value).toBeCloseTo(density, 9);
    expect(c.verdict).toBe(verdict);
    expect(c.limit).toBe(10);
  });

  it('names a gauge that carries it comfortably', () => {
    // 3 A needs at least 0.75 mm² → 18 AWG (0.823 mm²); 19 AWG is 0.653 mm²
    expect(at(3).message).toContain('Use 18 AWG or thicker');
  });

  it('uses the current with the LEDs on, not the PWM average', () => {
    const r = checkKit(linearSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty: 0.1, wiring: { lengthMeters: 1, awg: 24 } }));
    expect(checkOf(r, 'wire-current-density').value).toBeCloseTo(1 / area, 9);
  });
});

// One LED with vfMin = vfTyp = vfMax = 3 V so the worst-case power is 3 V × I.
const oneLed = (amps: number, extra: Partial<KitSpec> = {}, led: Partial<KitSpec['string']['led']> = {}): KitSpec => ({
  supply: { volts: 12, tolerancePct: 0, maxAmps: 10 },
  driver: { type: 'buck', minInputVolts: 5, maxInputVolts: 36, outputAmps: amps },
  string: { count: 1, led: { vfMin: 3, vfTyp: 3, vfMax: 3, maxAmps: 5, maxWatts: 20, ...led } },
  ...extra,
});

describe('rule 7: LED junction temperature', () => {
  // Without a sink: T_j = 25 °C + P × (8 + 2 + 40) °C/W — 8 °C/W junction → solder point, 2 °C/W board,
  // 40 °C/W bare 20 mm star in still air, 25 °C ambient (all from memory). 125 °C maximum (from memory),
  // caution within 25 °C of it (common practice (no source)).
  it.each([
    [0.5, 'ok'], // 1.5 W → 100 °C exactly
    [0.501, 'caution'],
    [2 / 3, 'caution'], // 2 W → 125 °C exactly
    [0.667, 'fail'],
  ] as const)('bare star at %f A → %s', (amps, verdict) => {
    const r = checkKit(oneLed(amps));
    expect(r.figures.ledJunctionC).toBeCloseTo(25 + 3 * amps * 50, 9);
    expect(checkOf(r, 'led-junction').verdict).toBe(verdict);
    expect(r.figures.sinkC).toBeUndefined();
  });

  it('with the kit’s sinks: T_sink = ambient + (N × P / count) × cPerW, T_j = T_sink + P × (Rjs + 2)', () => {
    // 4 LEDs at 1 W each on 2 sinks of 5 °C/W: sink 25 + 2 × 5 = 35 °C, junction 35 + 1 × 10 = 45 °C
    const spec = oneLed(1 / 3, { heatSink: { count: 2, cPerW: 5 } });
    const r = checkKit({ ...spec, string: { ...spec.string, count: 4 }, supply: { ...spec.supply, volts: 24 } });
    expect(r.figures.sinkC).toBeCloseTo(35, 9);
    expect(r.figures.ledJunctionC).toBeCloseTo(45, 9);
    // largest sink that keeps T_j ≤ 100 °C: (100 − 25 − 10) / (4 × 1 / 2) = 32.5 °C/W
    expect(r.figures.sinkCPerWNeeded).toBeCloseTo(32.5, 9);
  });

  it('the ambient, the LED’s own resistance and maximum junction are used when given', () => {
    const r = checkKit(oneLed(0.5, { ambientC: 40 }, { thermalOhmsJs: 3, maxJunctionC: 150 }));
    // 40 + 1.5 × (3 + 2 + 40) = 107.5 °C: under 150 − 25 → ok
    expect(r.figures.ledJunctionC).toBeCloseTo(107.5, 9);
    expect(checkOf(r, 'led-junction').verdict).toBe('ok');
    expect(checkOf(r, 'led-junction').limit).toBe(150);
  });

  it('without a sink, sinkCPerWNeeded is for one sink per LED; absent when no sink can do it', () => {
    // 1.5 W: (100 − 25 − 15) / 1.5 = 40 °C/W
    expect(checkKit(oneLed(0.5)).figures.sinkCPerWNeeded).toBeCloseTo(40, 9);
    // 8 W: 25 + 8 × 10 = 105 °C before any sink → no sink can keep it at 100 °C
    const hot = checkKit(oneLed(8 / 3, {}, { maxWatts: 20 }));
    expect(hot.figures.sinkCPerWNeeded).toBeUndefined();
    expect(checkOf(hot, 'led-junction').message).toMatch(/No heat sink is enough/);
  });

  it('a caution names the sink that would do', () => {
    const c = checkOf(checkKit(oneLed(0.6)), 'led-junction');
    // 1.8 W: (75 − 18) / 1.8 = 31.67 → "at most 31.6 °C/W"
    expect(c.verdict).toBe('caution');
    expect(c.message).toContain('at most 31.6 °C/W');
  });

  it('counts the worst-case power: the resistor’s worst Vf corner, and PWM', () => {
    const r = checkKit(resistorSpec());
    expect(r.figures.ledJunctionC).toBeCloseTo(25 + r.figures.ledWatts * 50, 9);
    const dim = checkKit(oneLed(1, { pwmDuty: 0.5 }));
    expect(dim.figures.ledJunctionC).toBeCloseTo(25 + 1.5 * 50, 9);
  });
});

describe('schema defaults for the new inputs (from memory)', () => {
  it('LED 8 °C/W and 125 °C; regulator 5 °C/W and 125 °C; ambient 25 °C', () => {
    const p = kitSpecSchema.parse(linearSpec());
    expect(p.string.led).toMatchObject({ thermalOhmsJs: 8, maxJunctionC: 125 });
    expect(p.driver).toMatchObject({ junctionToCaseCPerW: 5, maxJunctionC: 125 });
    expect(p.ambientC).toBe(25);
    expect(p.heatSink).toBeUndefined();
  });
});
