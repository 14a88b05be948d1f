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

describe('LED power, worst case vfMax × average current: caution above 70 % of the rating, fail above it', () => {
  // 70 % heat-sink line: common practice (no source). vfMax 3.2 V, rating 3 W → caution above 2.1 W
  // (0.65625 A), fail above 3 W (0.9375 A).
  const at = (amps: number, pwmDuty?: number) =>
    checkOf(checkKit(buckSpec({ driver: { outputAmps: amps }, led: { maxAmps: 2 }, pwmDuty })), 'led-power');

  it.each([
    [0.656, 'ok'],
    [0.65625, 'ok'],
    [0.657, 'caution'],
    [0.9375, 'caution'],
    [0.938, 'fail'],
  ] as const)('%f A → %s', (amps, verdict) => {
    expect(at(amps).verdict).toBe(verdict);
    expect(at(amps).value).toBeCloseTo(3.2 * amps, 12);
  });

  it('PWM lowers the average power: 1.2 A at 50 % is 1.92 W (ok), at 60 % is 2.304 W (caution)', () => {
    expect(at(1.2, 0.5).value).toBeCloseTo(1.92, 12);
    expect(at(1.2, 0.5).verdict).toBe('ok');
    expect(at(1.2, 0.6).verdict).toBe('caution');
  });

  it('a failing LED power suggests the current that fits', () => {
    // 3 W / 3.2 V = 0.9375 A
    expect(at(1.2).message).toContain('at most 938 mA');
  });
});

describe('supply current, worst case S_max × I_avg / η / V_low: caution above 80 %, fail above the rating', () => {
  // Buck, 24 V, 12.8 V worst-case string at 1 A, η 0.9: P_in = 14.222 W, I = 0.59259 A (energy balance,
  // TI SLVA477). 80 % line: common practice (no source).
  const I = (12.8 * 1) / 0.9 / 24;
  const at = (maxAmps: number, pwmDuty?: number) =>
    checkKit(buckSpec({ supply: { maxAmps }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty }));

  it.each([
    [0.75, 'ok'],
    [I / 0.8, 'ok'],
    [0.74, 'caution'],
    [I, 'caution'],
    [0.5925, 'fail'],
  ] as const)('supply rated %f A → %s', (maxAmps, verdict) => {
    expect(checkOf(at(maxAmps), 'supply-current').verdict).toBe(verdict);
  });

  it('the low end of the supply sets the current: ±10 % → 14.222 / 21.6 = 0.658 A', () => {
    const r = checkKit(buckSpec({ supply: { tolerancePct: 10 }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 } }));
    expect(r.figures.supplyAmps).toBeCloseTo(14.2222 / 21.6, 4);
  });

  it('with PWM the average supply current scales with the duty', () => {
    expect(checkOf(at(2, 0.5), 'supply-current').value).toBeCloseTo(I / 2, 12);
  });

  it('linear: the supply gives the average string current', () => {
    expect(checkKit(linearSpec({ pwmDuty: 0.5 })).figures.supplyAmps).toBeCloseTo(0.175, 12);
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

  it('a drop over 5 % of the supply gets advice but no caution (common practice (no source))', () => {
    // 28 m of 18 AWG → 1.173 V, 29 m → 1.215 V at 1 A, against 1.2 V (5 % of 24 V).
    const at = (lengthMeters: number) =>
      checkOf(
        checkKit(linearSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters, awg: 18 } })),
        'wire-drop',
      );
    expect(at(28).verdict).toBe('ok');
    expect(at(28).message).not.toMatch(/AWG or thicker/);
    const c = at(29);
    expect(c.verdict).toBe('ok');
    expect(c.message).toMatch(/Use \d+ AWG or thicker/);
  });

  it('buck: the drop and the supply current agree with Ohm\'s law and P = V × I', () => {
    const r = checkKit(buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters: 5, awg: 24 } }));
    const loop = 2 * 5 * awgOhmsPerMeter(24);
    const drop = r.figures.wireDropVolts!;
    expect(drop).toBeCloseTo(loop * r.figures.supplyAmps, 9);
    expect((24 - drop) * r.figures.supplyAmps).toBeCloseTo(r.figures.inputWatts, 9);
  });

  it('buck: fails when the wire cannot carry the driver\'s power (no real root of I × (V − I R) = P)', () => {
    // P_on = 12.8 / 0.9 = 14.222 W from 24 V: collapse above R = 24² / (4 × 14.222) = 10.125 Ω; 30 AWG is
    // 0.3385 Ω/m (ASTM B258 + IEC 60028), so the loop passes 10.125 Ω between 14 m (9.48 Ω) and 15 m (10.16 Ω).
    const at = (lengthMeters: number) =>
      checkKit(buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters, awg: 30 } }));
    expect(checkOf(at(14), 'wire-drop').verdict).toBe('ok');
    const collapsed = at(15);
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
