import { describe, expect, it } from 'vitest';
import { compareTopologies } from '@/lib/electrical';

// The three-way comparison row by row: each row's figures come from the full check with a generic driver
// (lib/electrical/README.md, "Ranking … and the three-way comparison"); here the rows' own arithmetic —
// parts, heat-sink note, rank and reason — is worked by hand.
// Six LEDs, Vf 2.8 / 3.0 / 3.4 V: the string is 16.8 / 18.0 / 20.4 V (series forward voltages add).
const string = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };
const byType = (rows: ReturnType<typeof compareTopologies>) => Object.fromEntries(rows.map((r) => [r.type, r]));

describe('the comparison rows, worked by hand', () => {
  it('24 V ± 5 %, 350 mA: a cautious buck, a linear stage too hot to pass, a resistor that needs a sink', () => {
    const { buck, linear, resistor } = byType(compareTopologies(string, { volts: 24, maxAmps: 2 }, { amps: 0.35 }));
    // Buck: P_out = S_max × I = 20.4 × 0.35 = 7.14 W, heat P_out / η − P_out = 0.793 W (energy balance, TI
    // SLVA477), under the 1 W heat-sink line (common practice (no source)): six parts, no sink. Worst-case
    // duty 20.4 / (22.8 × 0.9) = 0.994 over 0.95: a caution.
    expect(buck.heatWatts).toBeCloseTo(0.79333, 4);
    expect(buck.parts).toBe(6);
    expect(buck.partsNote).not.toContain('heat sink');
    expect(buck.reason).toBe('90.0 % efficient, wastes 0.79 W, 6 parts, with cautions');
    // The generic driver takes the whole supply window: its rating is the supply's high end, 25.2 V.
    expect(buck.report?.checks.find((c) => c.id === 'supply-vs-driver-max')?.limit).toBeCloseTo(25.2, 12);
    expect(buck.report?.checks.find((c) => c.id === 'supply-vs-driver-min')?.limit).toBe(1);
    // Linear: (25.2 − 16.8) × 0.35 = 2.94 W in free air, 25 + 2.94 × 62.5 = 209 °C at its junction (TO-220
    // class free air, from memory): fails; it says which check.
    expect(linear.verdict).toBe('fail');
    expect(linear.reason).toBe('fails: regulator-junction');
    expect(linear.parts).toBe(3);
    expect(linear.partsNote).toContain('plus a heat sink');
    // Resistor: (24 − 18) / 0.35 = 17.1 Ω → 18 Ω (IEC 60063 E24); I_max = (25.2 − 16.8) / 18 = 0.467 A,
    // I²R = 3.92 W (Joule), bought at twice that → 10 W; efficiency S_typ / V = 18 / 24 = 75 %.
    expect(resistor.driverNote).toBe('a resistor of 18 Ω (E24), rated 10 W');
    expect(resistor.heatWatts).toBeCloseTo(0.46667 ** 2 * 18, 3);
    expect(resistor.reason).toBe('75.0 % efficient, wastes 3.92 W (needs a heat sink), 2 parts');
    expect(resistor.partsNote).toBe('one resistor, plus a heat sink');
    // Passing first, then least heat: resistor (ok), buck (caution), linear (fail).
    expect([resistor.rank, buck.rank, linear.rank]).toEqual([1, 2, 3]);
  });

  it('a resistor under a watt is one part, said in the singular', () => {
    // 20 V, 100 mA: (20 − 18) / 0.1 = 20 Ω (in E24); I_max = (21 − 16.8) / 20 = 0.21 A, 0.882 W (Joule)
    const { resistor } = byType(compareTopologies(string, { volts: 20, maxAmps: 2 }, { amps: 0.1 }));
    expect(resistor.driverNote).toBe('a resistor of 20 Ω (E24), rated 2 W');
    expect(resistor.verdict).toBe('ok');
    expect(resistor.parts).toBe(1);
    expect(resistor.reason).toBe('90.0 % efficient, wastes 0.88 W, 1 part');
  });

  it('a resistor whose heat no stock rating covers is tried at the largest, 50 W', () => {
    // 48 V, 1 A: (48 − 18) / 1 = 30 Ω (E24); I_max = (50.4 − 16.8) / 30 = 1.12 A, 37.6 W — twice that is over
    // the 50 W stock rating (common practice (no source)), so the check is run with 50 W: over half of it,
    // a caution on the resistor; 1.12 A is over the LEDs' 0.7 A, so the row fails on the LED current.
    const { resistor } = byType(compareTopologies(string, { volts: 48, maxAmps: 5 }, { amps: 1 }));
    expect(resistor.driverNote).toBe('a resistor of 30 Ω (E24), rated 50 W');
    expect(resistor.report?.checks.find((c) => c.id === 'resistor-power')).toMatchObject({ verdict: 'caution', limit: 50 });
    expect(resistor.verdict).toBe('fail');
    expect(resistor.reason).toMatch(/^fails: led-current/);
  });

  it('a supply just above the string asks for a resistor under 0.01 Ω: a failing row without a report', () => {
    // (18.0001 − 18) / 0.35 A = 0.29 mΩ, below the check's smallest resistance
    const rows = compareTopologies(string, { volts: 18.0001, tolerancePct: 0, maxAmps: 2 }, { amps: 0.35 });
    const { resistor } = byType(rows);
    expect(resistor).toMatchObject({
      verdict: 'fail',
      report: null,
      efficiency: 0,
      heatWatts: 0,
      inputWatts: 0,
      supplyAmps: 0,
      parts: 1,
      partsNote: 'one resistor',
      driverNote: 'the resistor this current needs is under 0.01 Ω',
      reason: 'the resistor this current needs is under 0.01 Ω',
    });
    // A supply under the string: the design says why, and the row repeats it.
    const under = byType(compareTopologies(string, { volts: 12, maxAmps: 2 }, { amps: 0.35 })).resistor;
    expect(under.reason).toBe(under.driverNote);
    expect(under.reason).toMatch(/not above the string/);
  });

  it('failing rows are ranked by heat too, and an equal heat by fewer parts', () => {
    // 12 V: every row fails. No resistor can work (no report, no heat, 1 part); the supply's high end,
    // 12.6 V, is under the string's 16.8 V minimum, so the linear stage's loss (V_high − S_min) × I counts
    // as 0 W (2 parts); the buck's worst case still counts its conversion loss. 0 W and 0 W: fewer parts first.
    const { buck, linear, resistor } = byType(compareTopologies(string, { volts: 12, maxAmps: 2 }, { amps: 0.35 }));
    expect([buck.verdict, linear.verdict, resistor.verdict]).toEqual(['fail', 'fail', 'fail']);
    expect([linear.heatWatts, resistor.heatWatts]).toEqual([0, 0]);
    expect(buck.heatWatts).toBeGreaterThan(0);
    expect([resistor.rank, linear.rank, buck.rank]).toEqual([1, 2, 3]);
  });

  it('exactly 1 W of heat needs no heat sink; exactly 0.01 Ω is still a resistor the check takes', () => {
    // Six LEDs of 3.0 / 3.1 / 3.2 V (18 / 18.6 / 19.2 V) on 19 V at 0 %: (19 − 18.6) / 0.4 A = 1 Ω (E24);
    // I_max = (19 − 18) / 1 = 1 A, I²R = 1 W exactly (Joule) — not above the 1 W line
    // (common practice (no source)). One 1 °C/W sink per LED keeps the junctions cool.
    const six = { count: 6, led: { vfMin: 3.0, vfTyp: 3.1, vfMax: 3.2, maxAmps: 2, maxWatts: 10 } };
    const { resistor } = byType(
      compareTopologies(six, { volts: 19, tolerancePct: 0, maxAmps: 5 }, { amps: 0.4, heatSink: { count: 6, cPerW: 1 } }),
    );
    expect(resistor.heatWatts).toBe(1);
    expect(resistor.parts).toBe(1);
    expect(resistor.partsNote).toBe('one resistor');
    expect(resistor.reason).toBe('97.9 % efficient, wastes 1.00 W, 1 part');
    // (18.00336 − 18) / 0.35 A = 9.6 mΩ → 0.01 Ω (IEC 60063 E24), the smallest resistance the check takes
    const tiny = byType(compareTopologies(string, { volts: 18.00336, tolerancePct: 0, maxAmps: 2 }, { amps: 0.35 })).resistor;
    expect(tiny.report).not.toBeNull();
    expect(tiny.driverNote).toBe('a resistor of 0.01 Ω (E24), rated 50 W');
  });
});
