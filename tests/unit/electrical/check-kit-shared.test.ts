import { describe, expect, it } from 'vitest';
import { awgOhmsPerMeter, checkKit } from '@/lib/electrical';
import { buckSpec, checkOf, linearSpec, resistorSpec } from './fixtures';

describe('LED peak current (contract rule: PWM does not excuse peak current)', () => {
  it('set current at the rating is ok, above it fails', () => {
    expect(checkOf(checkKit(buckSpec({ driver: { outputAmps: 1 }, led: { maxWatts: 10 } })), 'led-current').verdict).toBe('ok');
    const c = checkOf(checkKit(buckSpec({ driver: { outputAmps: 1.001 }, led: { maxWatts: 10 } })), 'led-current');
    expect(c.verdict).toBe('fail');
    expect(c.message).toContain('at most 1.000 A');
  });

  it('dimming to 10 % still fails an over-current driver', () => {
    const r = checkKit(buckSpec({ driver: { outputAmps: 1.2 }, pwmDuty: 0.1 }));
    expect(checkOf(r, 'led-current').verdict).toBe('fail');
    expect(r.verdict).toBe('fail');
    expect(r.figures.ledAmpsPeak).toBe(1.2);
    expect(r.figures.ledAmpsAvg).toBeCloseTo(0.12, 12);
  });

  it('applies to linear drivers too', () => {
    expect(checkOf(checkKit(linearSpec({ driver: { outputAmps: 1.01 } })), 'led-current').verdict).toBe('fail');
  });
});

describe('LED power vfTyp × average current: caution above 70 % of the rating, fail above it', () => {
  // 70 % heat-sink line: common practice (no source). vfTyp 3 V, rating 3 W → caution above 2.1 W (0.7 A).
  const at = (amps: number, pwmDuty?: number) =>
    checkOf(checkKit(buckSpec({ driver: { outputAmps: amps }, led: { maxAmps: 2 }, pwmDuty })), 'led-power');

  it.each([
    [0.699, 'ok'],
    [0.701, 'caution'],
    [0.999, 'caution'],
    [1.001, 'fail'],
  ] as const)('%f A → %s', (amps, verdict) => {
    expect(at(amps).verdict).toBe(verdict);
  });

  it('PWM lowers the average power: 1.2 A at 50 % is 1.8 W (ok), at 60 % is 2.16 W (caution)', () => {
    expect(at(1.2, 0.5).value).toBeCloseTo(1.8, 12);
    expect(at(1.2, 0.5).verdict).toBe('ok');
    expect(at(1.2, 0.6).verdict).toBe('caution');
  });

  it('a failing LED power suggests the current that fits', () => {
    // 3 W / 3 V = 1 A
    expect(at(1.2).message).toContain('at most 1.000 A');
  });
});

describe('supply current P_in / V_low: caution above 80 %, fail above the rating', () => {
  // Buck, 24 V, 12 V string at 1 A, η 0.9: P_in = 13.333 W, I = 0.5556 A (energy balance).
  // 80 % line: common practice (no source).
  const at = (maxAmps: number, pwmDuty?: number) =>
    checkKit(buckSpec({ supply: { maxAmps }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty }));

  it.each([
    [0.7, 'ok'],
    [0.69, 'caution'],
    [0.556, 'caution'],
    [0.555, 'fail'],
  ] as const)('supply rated %f A → %s', (maxAmps, verdict) => {
    expect(checkOf(at(maxAmps), 'supply-current').verdict).toBe(verdict);
  });

  it('the low end of the supply sets the current: ±10 % → 13.333 / 21.6 = 0.617 A', () => {
    const r = checkKit(buckSpec({ supply: { tolerancePct: 10 }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 } }));
    expect(r.figures.supplyAmps).toBeCloseTo(13.3333 / 21.6, 4);
  });

  it('with PWM the average drops, but each pulse still draws the full current', () => {
    const ok = at(0.56, 0.5);
    expect(checkOf(ok, 'supply-current').value).toBeCloseTo(0.27778, 5);
    expect(checkOf(ok, 'supply-peak').verdict).toBe('ok');
    const tight = at(0.55, 0.5);
    expect(checkOf(tight, 'supply-current').verdict).toBe('ok');
    expect(checkOf(tight, 'supply-peak').verdict).toBe('caution');
  });

  it('no PWM, no pulse check', () => {
    expect(at(2).checks.map((c) => c.id)).not.toContain('supply-peak');
  });
});

describe('wire run: 2 × length × Ω/m(AWG) × I comes off the supply low end', () => {
  it('linear driver: drop = loop resistance × set current', () => {
    // 10 m of 18 AWG (ASTM B258 + IEC 60028: 20.95 Ω/km) at 1 A: 2 × 10 × 0.02095 × 1 = 0.419 V.
    const r = checkKit(linearSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters: 10, awg: 18 } }));
    expect(r.figures.wireDropVolts).toBeCloseTo(2 * 10 * awgOhmsPerMeter(18) * 1, 12);
    expect(r.figures.wireDropVolts).toBeCloseTo(0.419, 3);
    expect(checkOf(r, 'headroom').value).toBeCloseTo(24 - 0.419, 3);
  });

  it('cautions above 5 % of the supply (1.2 V of 24 V): 28 m of 18 AWG ok, 29 m caution', () => {
    // 5 % drop line: common practice (no source). 28 m → 1.173 V, 29 m → 1.215 V at 1 A.
    const at = (lengthMeters: number) =>
      checkOf(
        checkKit(linearSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters, awg: 18 } })),
        'wire-drop',
      );
    expect(at(28).verdict).toBe('ok');
    const c = at(29);
    expect(c.verdict).toBe('caution');
    expect(c.message).toMatch(/Use \d+ AWG or thicker/);
  });

  it('buck: the drop and the supply current agree with Ohm\'s law and P = V × I', () => {
    const r = checkKit(buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters: 5, awg: 24 } }));
    const loop = 2 * 5 * awgOhmsPerMeter(24);
    const drop = r.figures.wireDropVolts!;
    expect(drop).toBeCloseTo(loop * r.figures.supplyAmps, 9);
    expect((24 - drop) * r.figures.supplyAmps).toBeCloseTo(r.figures.inputWatts, 9);
  });

  it('buck: fails when the wire cannot carry the driver\'s power (4RP > Vs²)', () => {
    // P_in = 13.333 W from 24 V: collapse above R = 24² / (4 × 13.333) = 10.8 Ω; 30 AWG is 0.3385 Ω/m,
    // so the loop passes 10.8 Ω between 15 m (10.16 Ω) and 17 m (11.51 Ω).
    const at = (lengthMeters: number) =>
      checkKit(buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters, awg: 30 } }));
    expect(checkOf(at(15), 'wire-drop').verdict).toBe('caution');
    const collapsed = at(17);
    expect(checkOf(collapsed, 'wire-drop').verdict).toBe('fail');
    expect(collapsed.verdict).toBe('fail');
  });

  it('without wiring there is no drop figure', () => {
    expect(checkKit(buckSpec()).figures.wireDropVolts).toBeUndefined();
  });
});

describe('report verdict', () => {
  it('is the worst of the checks', () => {
    const caution = checkKit(buckSpec({ supply: { volts: 14.5 } }));
    expect(caution.checks.some((c) => c.verdict === 'caution')).toBe(true);
    expect(caution.checks.some((c) => c.verdict === 'fail')).toBe(false);
    expect(caution.verdict).toBe('caution');
  });

  it('every check carries a value, a limit, a unit and a message', () => {
    for (const spec of [buckSpec({ pwmDuty: 0.5, wiring: { lengthMeters: 2, awg: 22 }, driver: { inductorHenries: 1e-4, switchingHz: 2e5, maxOutputVolts: 30 } }), linearSpec({ pwmDuty: 0.3 }), resistorSpec({ wiring: { lengthMeters: 1, awg: 24 } })]) {
      for (const c of checkKit(spec).checks) {
        expect(Number.isFinite(c.value)).toBe(true);
        expect(Number.isFinite(c.limit)).toBe(true);
        expect(c.unit.length).toBeGreaterThan(0);
        expect(c.message.length).toBeGreaterThan(20);
      }
    }
  });
});
