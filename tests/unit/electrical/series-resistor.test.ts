import { describe, expect, it } from 'vitest';
import { checkKit, compareTopologies, designSeriesResistor } from '@/lib/electrical';
import { LED } from './fixtures';

describe('series-resistor design', () => {
  it('R = (V − N × Vf) / I, rounded up to the series', () => {
    // Ohm's law (Horowitz & Hill, The Art of Electronics, ch. 1): (12 − 3 × 3.0) / 0.022 = 136.4 Ω → E24 150 Ω (IEC 60063).
    const d = designSeriesResistor({ string: { count: 3, led: LED }, supply: { volts: 12, tolerancePct: 0, maxAmps: 1 }, amps: 0.022 });
    if (!d.feasible) throw new Error('expected a design');
    expect(d.ohmsExact).toBeCloseTo(136.3636, 4);
    expect(d.ohms).toBe(150);
    expect(d.ampsTyp).toBeCloseTo(0.02, 12);
    // worst corner 12 V with vfMin 2.8: (12 − 8.4) / 150 = 24 mA; P = I²R = 0.0864 W (Joule)
    expect(d.ampsMax).toBeCloseTo(0.024, 12);
    expect(d.wattsMax).toBeCloseTo(0.0864, 12);
    // twice the worst heat (common practice (no source)) = 0.173 W → buy 0.25 W
    expect(d.wattageToBuy).toBe(0.25);
  });

  it('E12 rounds coarser: 107 Ω → 120 Ω, E24 → 110 Ω', () => {
    const args = { string: { count: 3, led: LED }, supply: { volts: 12, tolerancePct: 0, maxAmps: 1 }, amps: 0.028 };
    const e24 = designSeriesResistor(args);
    const e12 = designSeriesResistor({ ...args, series: 'E12' });
    expect(e24.feasible && e24.ohms).toBe(110);
    expect(e12.feasible && e12.ohms).toBe(120);
  });

  it('reports the tolerance corners', () => {
    const d = designSeriesResistor({ string: { count: 3, led: LED }, supply: { volts: 12, tolerancePct: 5, maxAmps: 1 }, amps: 0.03 });
    if (!d.feasible) throw new Error('expected a design');
    expect(d.ohms).toBe(100);
    expect(d.ampsMax).toBeCloseTo((12.6 - 8.4) / 100, 12);
    expect(d.ampsMin).toBeCloseTo((11.4 - 9.6) / 100, 12);
  });

  it('agrees with the full check for the same resistor', () => {
    const d = designSeriesResistor({ string: { count: 3, led: LED }, supply: { volts: 12, tolerancePct: 5, maxAmps: 1 }, amps: 0.03 });
    if (!d.feasible || d.wattageToBuy === null) throw new Error('expected a design');
    const r = checkKit({
      supply: { volts: 12, tolerancePct: 5, maxAmps: 1 },
      driver: { type: 'resistor', ohms: d.ohms, watts: d.wattageToBuy },
      string: { count: 3, led: LED },
    });
    expect(r.figures.resistorAmpsMax).toBeCloseTo(d.ampsMax, 12);
    expect(r.figures.lossWatts).toBeCloseTo(d.wattsMax, 12);
    expect(r.checks.find((c) => c.id === 'resistor-power')?.verdict).toBe('ok');
  });

  it('works out the typical heat and the rating to buy from the worst heat', () => {
    // 12 V ± 5 %, 3 LEDs, 30 mA: 100 Ω (E24). Typical (12 − 9) / 100 = 30 mA, 0.03² × 100 = 0.09 W (Joule);
    // worst (12.6 − 8.4) / 100 = 42 mA, 0.1764 W; twice that, 0.353 W, is bought as 0.5 W
    // (common practice (no source)).
    const d = designSeriesResistor({ string: { count: 3, led: LED }, supply: { volts: 12, tolerancePct: 5, maxAmps: 1 }, amps: 0.03 });
    if (!d.feasible) throw new Error('expected a design');
    expect(d.series).toBe('E24');
    expect(d.wattsTyp).toBeCloseTo(0.09, 12);
    expect(d.wattsMax).toBeCloseTo(0.1764, 12);
    expect(d.wattageToBuy).toBe(0.5);
  });

  it('refuses a current that is not a positive finite number', () => {
    const base = { string: { count: 3, led: LED }, supply: { volts: 12, maxAmps: 1 } };
    for (const amps of [0, -0.02, Number.NaN, Infinity]) expect(() => designSeriesResistor({ ...base, amps })).toThrow(RangeError);
  });

  it('up to 10 MΩ, the largest resistance the check takes', () => {
    // 1 V spare at 100 nA is exactly 10 MΩ (Ohm's law), a member of E24; 1.1 V spare is 11 MΩ: too much.
    const supply = { volts: 10, tolerancePct: 0, maxAmps: 1 };
    const at = designSeriesResistor({ string: { count: 3, led: LED }, supply, amps: 1e-7 });
    expect(at.feasible && at.ohms).toBe(1e7);
    const over = designSeriesResistor({ string: { count: 3, led: LED }, supply: { ...supply, volts: 10.1 }, amps: 1e-7 });
    expect(over.feasible).toBe(false);
    if (!over.feasible) expect(over.reason).toMatch(/above 10 MΩ/);
  });

  it('is not possible when the supply does not clear the string', () => {
    // 4 × 3.0 V = 12 V typical on a 12 V supply: no voltage is left for a resistor
    const d = designSeriesResistor({ string: { count: 4, led: LED }, supply: { volts: 12, maxAmps: 1 }, amps: 0.02 });
    expect(d.feasible).toBe(false);
    if (!d.feasible) expect(d.reason).toMatch(/not above the string/);
  });
});

describe('buck vs linear vs resistor', () => {
  const string = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };

  it('compares the three on the same string and supply', () => {
    const rows = compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 0.35 });
    expect(rows.map((r) => r.type)).toEqual(['buck', 'linear', 'resistor']);
    const [buck, linear, resistor] = rows;
    // buck: the generic 90 % driver (TI SLVA477 style energy balance: P_in = P_out / η)
    expect(buck.efficiency).toBe(0.9);
    // worst case: the string at its maximum, 6 × 3.4 = 20.4 V
    expect(buck.heatWatts).toBeCloseTo((20.4 * 0.35) / 0.9 - 20.4 * 0.35, 9);
    // linear: η = Vstring / V = 18 / 24 and worst heat (25.2 − 16.8) × 0.35 = 2.94 W → needs a heat sink
    expect(linear.efficiency).toBeCloseTo(0.75, 12);
    expect(linear.heatWatts).toBeCloseTo(2.94, 9);
    expect(linear.parts).toBe(3);
    // resistor: (24 − 18) / 0.35 = 17.1 Ω → E24 18 Ω
    expect(resistor.driverNote).toContain('18 Ω');
    expect(resistor.efficiency).toBeCloseTo(0.75, 12);
    // the buck wastes least
    expect(buck.heatWatts).toBeLessThan(linear.heatWatts);
    expect(buck.heatWatts).toBeLessThan(resistor.heatWatts);
    // parts: common practice (no source) — a discrete buck stage has about six parts, a resistor one
    expect(buck.parts).toBeGreaterThan(linear.parts);
    expect(resistor.parts).toBeLessThanOrEqual(2);
  });

  it('marks the resistor impossible when the supply is under the string', () => {
    const rows = compareTopologies(string, { volts: 12, maxAmps: 2 }, { amps: 0.35 });
    const resistor = rows.find((r) => r.type === 'resistor')!;
    expect(resistor.verdict).toBe('fail');
    expect(resistor.report).toBeNull();
    // and the others fail on headroom too
    expect(rows.every((r) => r.verdict === 'fail')).toBe(true);
  });

  it('defaults the current to 70 % of what the LED allows (common practice (no source))', () => {
    // 0.7 × min(0.7 A, 3 W / 3.4 V) = 0.7 × 0.7 = 0.49 A
    const rows = compareTopologies(string, { volts: 24, maxAmps: 2 });
    expect(rows[0].report?.figures.ledAmpsPeak).toBeCloseTo(0.49, 12);
    // a power-limited LED: 0.7 × 2 W / 3.4 V = 0.41176 A
    const hot = compareTopologies({ count: 6, led: { ...string.led, maxWatts: 2 } }, { volts: 24, maxAmps: 2 });
    expect(hot[0].report?.figures.ledAmpsPeak).toBeCloseTo((0.7 * 2) / 3.4, 12);
  });

  it('ranks the passing topology that wastes least first, and says why', () => {
    // 24 V: the buck's worst-case duty is a caution, the bare linear regulator fails on heat, the resistor
    // passes: passing comes first.
    const tight = compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 0.35 });
    expect(tight.map((r) => [r.type, r.verdict, r.rank])).toEqual([
      ['buck', 'caution', 2],
      ['linear', 'fail', 3],
      ['resistor', 'ok', 1],
    ]);
    // 27 V: buck and resistor both pass; the buck wastes less
    const rows = compareTopologies(string, { volts: 27, maxAmps: 2 }, { amps: 0.35 });
    const byRank = [...rows].sort((a, b) => a.rank - b.rank);
    expect(byRank.map((r) => r.verdict).slice(0, 2)).toEqual(['ok', 'ok']);
    expect(byRank[0].type).toBe('buck');
    expect(byRank[0].reason).toMatch(/90\.0 % efficient/);
    expect(byRank[1].reason).toMatch(/needs a heat sink/);
    for (const r of rows) expect(r.reason.length).toBeGreaterThan(5);
    // a failing row says which checks fail
    const failing = compareTopologies(string, { volts: 12, maxAmps: 2 }, { amps: 0.35 }).find((r) => r.type === 'buck')!;
    expect(failing.reason).toMatch(/^fails: .*headroom/);
  });

  it('takes the same optional inputs as the check (heat sink, ambient, wiring) and validates them', () => {
    const rows = compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 0.35, ambientC: 40, heatSink: { count: 1, cPerW: 2 } });
    expect(rows[0].report?.figures.sinkC).toBeDefined();
    expect(() => compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 1e308 })).toThrow(/Drive current/);
  });

  it('a subnormal drive current does not throw: the resistor it needs is out of range', () => {
    const rows = compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 1e-310 });
    expect(rows.find((r) => r.type === 'resistor')?.report).toBeNull();
    expect(JSON.stringify(rows)).not.toContain('null,"');
  });
});
