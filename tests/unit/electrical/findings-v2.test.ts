// Regression tests for the findings that led to version 2 of the check (issue #10). Each one failed on
// the version-1 rules; the source of every number is named beside it.
import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { type KitReport, type KitSpec, checkKit, formatQuantity } from '@/lib/electrical';
import { checkOf } from './fixtures';

function issuePaths(spec: unknown): string[] {
  try {
    checkKit(spec as KitSpec);
  } catch (e) {
    expect(e).toBeInstanceOf(ZodError);
    return (e as ZodError).issues.map((i) => i.path.join('.'));
  }
  throw new Error('expected a ZodError');
}

/** Every number anywhere in the report is finite (JSON would turn NaN and ±Infinity into null). */
export function expectAllFinite(report: KitReport) {
  const walk = (v: unknown, path: string) => {
    if (typeof v === 'number') expect(Number.isFinite(v), `${path} = ${v}`).toBe(true);
    else if (v === null) throw new Error(`${path} is null`);
    else if (typeof v === 'object') for (const [k, x] of Object.entries(v as object)) walk(x, `${path}.${k}`);
  };
  walk(report, 'report');
  expect(JSON.stringify(report)).not.toContain('null');
}

// 4 LEDs of 2.8 / 3.0 / 3.6 V at 1 A from a 1 A buck on a 24 V ±5 % supply.
const worstCaseBuild = (over: { supplyAmps?: number; ledWatts?: number } = {}): KitSpec => ({
  supply: { volts: 24, maxAmps: over.supplyAmps ?? 0.6 },
  driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 1 },
  string: { count: 4, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.6, maxAmps: 1.5, maxWatts: over.ledWatts ?? 10 } },
});

describe('finding 1: worst case, not typical, for supply current and LED power', () => {
  it('supply current at S_max and the supply low end: 14.4 W / 0.9 / 22.8 V = 0.702 A > 0.6 A → fail', () => {
    // Energy balance of a buck (TI SLVA477): P_in = S_max × I / η; I_s = P_in / V_low.
    const r = checkKit(worstCaseBuild());
    const c = checkOf(r, 'supply-current');
    expect(c.value).toBeCloseTo((4 * 3.6 * 1) / 0.9 / 22.8, 12);
    expect(c.verdict).toBe('fail');
    expect(r.figures.supplyAmps).toBeCloseTo(0.70175, 5);
    expect(r.verdict).toBe('fail');
  });

  it('an LED rated 3.3 W at 1 A with vfMax 3.6 V takes 3.6 W at worst → fail', () => {
    const c = checkOf(checkKit(worstCaseBuild({ supplyAmps: 5, ledWatts: 3.3 })), 'led-power');
    expect(c.value).toBeCloseTo(3.6, 12);
    expect(c.verdict).toBe('fail');
  });
});

// 4 LEDs of exactly 3 V (string 12 V) on 24 V ±0 % through a 1 A buck with η = 1: the ripple
// ΔI = (24 − 12) × 0.5 / (L × f) = 6 / (L × f) (TI SLVA477).
const rippleBuild = (henries: number, hz: number, over: { ledAmps?: number; sat?: number } = {}): KitSpec => ({
  supply: { volts: 24, tolerancePct: 0, maxAmps: 10 },
  driver: {
    type: 'buck',
    minInputVolts: 6,
    maxInputVolts: 36,
    outputAmps: 1,
    efficiency: 1,
    inductorHenries: henries,
    switchingHz: hz,
    ...(over.sat !== undefined ? { inductorSatAmps: over.sat } : {}),
  },
  string: { count: 4, led: { vfMin: 3, vfTyp: 3, vfMax: 3, maxAmps: over.ledAmps ?? 1, maxWatts: 10 } },
});

describe('finding 2: ripple reaches the LED check', () => {
  it('0.4 A peak to peak on a 1 A buck: peak 1.2 A (I_set + ΔI/2, TI SLVA477) fails a 1 A LED', () => {
    const r = checkKit(rippleBuild(50e-6, 300e3));
    expect(r.figures.rippleAmps).toBeCloseTo(0.4, 12);
    expect(r.figures.ledAmpsPeak).toBeCloseTo(1.2, 12);
    expect(checkOf(r, 'led-current').verdict).toBe('fail');
    expect(checkOf(r, 'led-current').value).toBeCloseTo(1.2, 12);
  });

  it('switchingHz 300 (meant as kHz) is outside [1 kHz, 10 MHz] and named', () => {
    expect(issuePaths(rippleBuild(50e-6, 300))).toContain('driver.switchingHz');
  });

  it('ΔI ≥ 2 × I_set: caution `ripple`, the converter leaves continuous conduction', () => {
    // 6 / (30 µH × 100 kHz) = 2 A = 2 × 1 A
    const c = checkOf(checkKit(rippleBuild(30e-6, 100e3, { ledAmps: 5 })), 'ripple');
    expect(c.verdict).toBe('caution');
    expect(c.message).toMatch(/continuous conduction/);
  });
});

describe('finding 3: a linear driver with no power rating can fail on heat', () => {
  it('146 W in one regulator in free air → regulator junction far above 125 °C → fail', () => {
    // loss = (V_high − S_min) × I = (60 − 1.6) × 2.5 = 146 W; T_j = 25 + 146 × 62.5 °C/W (TO-220 in
    // free air, from memory).
    const r = checkKit({
      supply: { volts: 60, tolerancePct: 0, maxAmps: 10 },
      driver: { type: 'linear', maxInputVolts: 60, outputAmps: 2.5, dropoutVolts: 1 },
      string: { count: 1, led: { vfMin: 1.6, vfTyp: 2, vfMax: 2.2, maxAmps: 3, maxWatts: 10 } },
    });
    expect(r.figures.lossWatts).toBeCloseTo(146, 9);
    expect(r.figures.regulatorJunctionC).toBeCloseTo(25 + 146 * 62.5, 6);
    expect(checkOf(r, 'regulator-junction').verdict).toBe('fail');
    expect(r.verdict).toBe('fail');
  });
});

describe('finding 4: the low-voltage limit and strict input', () => {
  it('30 LEDs on a 120 V DC supply fail `low-voltage-limit` (60 V SELV, IEC 61140 / IEC 60598-1, from memory)', () => {
    const r = checkKit({
      supply: { volts: 120, maxAmps: 5 },
      driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 200, outputAmps: 0.35 },
      string: { count: 30, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.2, maxAmps: 1, maxWatts: 3 } },
    });
    const c = checkOf(r, 'low-voltage-limit');
    expect(c.verdict).toBe('fail');
    expect(c.limit).toBe(60);
    expect(c.message).toMatch(/qualified/);
    expect(r.verdict).toBe('fail');
  });

  const base = worstCaseBuild({ supplyAmps: 5 });
  it('an AC supply sent as {"volts": 230, "type": "ac"} is refused at supply.type', () => {
    expect(issuePaths({ ...base, supply: { volts: 230, type: 'ac', maxAmps: 1 } })).toContain('supply.type');
  });

  it('supply.kind other than "dc" is refused at supply.kind', () => {
    expect(issuePaths({ ...base, supply: { ...base.supply, kind: 'ac' } })).toContain('supply.kind');
    expect(() => checkKit({ ...base, supply: { ...base.supply, kind: 'dc' } })).not.toThrow();
  });

  it.each([
    ['driver.efficency', { ...base, driver: { ...base.driver, efficency: 0.5 } }],
    ['supply.tolerance', { ...base, supply: { ...base.supply, tolerance: 10 } }],
    ['pwm', { ...base, pwm: 0.5 }],
    ['string.led.vfmax', { ...base, string: { ...base.string, led: { ...base.string.led, vfmax: 4 } } }],
    ['wiring.length', { ...base, wiring: { length: 2, awg: 18 } }],
    ['heatSink.cPerWatt', { ...base, heatSink: { count: 1, cPerW: 2, cPerWatt: 2 } }],
  ])('misspelt %s is refused by name', (path, spec) => {
    expect(issuePaths(spec)).toContain(path);
  });
});

describe('finding 5: a resistor on a supply equal to N × Vf,typ', () => {
  it('3 × 3.0 V on 9 V: I_typ = (V − S_typ) / R = 0 (Ohm’s law) → fail', () => {
    const r = checkKit({
      supply: { volts: 9, tolerancePct: 5, maxAmps: 1 },
      driver: { type: 'resistor', ohms: 10, watts: 5 },
      string: { count: 3, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.2, maxAmps: 1, maxWatts: 3 } },
    });
    const c = checkOf(r, 'typical-current');
    expect(c.value).toBe(0);
    expect(c.verdict).toBe('fail');
    expect(r.verdict).toBe('fail');
  });
});

describe('finding 6: wire current density', () => {
  it('3 A through 36 AWG (0.127 mm, ASTM B258): 237 A/mm² > 10 A/mm² → fail', () => {
    const r = checkKit({
      supply: { volts: 12, tolerancePct: 0, maxAmps: 10 },
      driver: { type: 'linear', maxInputVolts: 30, outputAmps: 3, dropoutVolts: 1 },
      string: { count: 1, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.2, maxAmps: 3, maxWatts: 10 } },
      wiring: { lengthMeters: 0.1, awg: 36 },
    });
    const c = checkOf(r, 'wire-current-density');
    expect(c.value).toBeCloseTo(3 / ((Math.PI * 0.127 ** 2) / 4), 6);
    expect(c.verdict).toBe('fail');
  });
});

describe('finding 7: rounding', () => {
  // 3 × 3.2 = 9.600000000000001 in binary floating point; + 1.5 V headroom = 11.100000000000001.
  const threeLeds = (volts: number): KitSpec => ({
    supply: { volts, tolerancePct: 0, maxAmps: 10 },
    driver: { type: 'buck', minInputVolts: 5, maxInputVolts: 36, outputAmps: 0.35, efficiency: 1, maxDuty: 1 },
    string: { count: 3, led: { vfMin: 3.0, vfTyp: 3.2, vfMax: 3.2, maxAmps: 1, maxWatts: 3 } },
  });

  it('a supply exactly at S_max + headroom (11.1 V) passes the headroom check', () => {
    expect(3 * 3.2 + 1.5).not.toBe(11.1);
    expect(checkOf(checkKit(threeLeds(11.1)), 'headroom').verdict).toBe('ok');
  });

  it('and 11.09 V is on the failing side', () => {
    expect(checkOf(checkKit(threeLeds(11.09)), 'headroom').verdict).toBe('fail');
  });

  it('a failing value and its limit never print the same', () => {
    // 13.49 V against the 13.5 V typical LEDs need (12 V + 1.5 V).
    const c = checkOf(
      checkKit({
        supply: { volts: 13.49, tolerancePct: 0, maxAmps: 10 },
        driver: { type: 'buck', minInputVolts: 5, maxInputVolts: 36, outputAmps: 0.35 },
        string: { count: 4, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.2, maxAmps: 1, maxWatts: 3 } },
      }),
      'headroom',
    );
    expect(c.verdict).toBe('fail');
    expect(c.message).not.toMatch(/gives 13\.5 V, short of the 13\.5 V/);
    expect(c.message).toContain('13.49 V');
    expect(c.message).toContain('13.50 V');
    expect(formatQuantity(13.49, 'V')).toBe('13.5 V');
  });
});

describe('finding 8: no NaN, Infinity or null in any figure', () => {
  it('1e308 V and 1e308 A are refused by the bounds, naming the field', () => {
    const base = worstCaseBuild();
    expect(issuePaths({ ...base, supply: { ...base.supply, volts: 1e308 } })).toContain('supply.volts');
    expect(issuePaths({ ...base, driver: { ...base.driver, outputAmps: 1e308 } })).toContain('driver.outputAmps');
  });

  it.each([
    ['subnormal supply volts', { supply: { volts: 1e-310, maxAmps: 1 } }],
    ['subnormal drive current', { driver: { type: 'buck', minInputVolts: 1e-310, maxInputVolts: 36, outputAmps: 1e-310 } }],
    ['subnormal supply rating', { supply: { volts: 24, maxAmps: 1e-310 } }],
    ['subnormal forward voltages', { string: { count: 200, led: { vfMin: 1e-310, vfTyp: 1e-310, vfMax: 1e-310, maxAmps: 1e-310, maxWatts: 1e-310 } } }],
    ['subnormal PWM duty', { pwmDuty: 1e-310 }],
    ['caps everywhere', {
      supply: { volts: 1000, tolerancePct: 50, maxAmps: 100 },
      driver: { type: 'buck', minInputVolts: 1000, maxInputVolts: 1000, outputAmps: 100, headroomVolts: 1000, maxDuty: 1e-310, efficiency: 1e-310, inductorHenries: 1e-7, switchingHz: 1e3, inductorSatAmps: 1e-310 },
      wiring: { lengthMeters: 1000, awg: 40 },
    }],
    ['a linear driver at the caps', {
      supply: { volts: 1000, tolerancePct: 50, maxAmps: 1e-310 },
      driver: { type: 'linear', maxInputVolts: 1e-310, outputAmps: 100, dropoutVolts: 1000, maxWatts: 1e-310, sinkCPerW: 200, junctionToCaseCPerW: 200 },
      wiring: { lengthMeters: 1000, awg: 40 },
    }],
    ['a resistor at the caps', { supply: { volts: 1000, tolerancePct: 50, maxAmps: 100 }, driver: { type: 'resistor', ohms: 0.01, watts: 1e-310 }, wiring: { lengthMeters: 1e-310, awg: -3 } }],
    ['a tiny resistor current', { supply: { volts: 1e-310, maxAmps: 1 }, driver: { type: 'resistor', ohms: 1e7, watts: 1e-310 }, string: { count: 1, led: { vfMin: 1e-320, vfTyp: 1e-320, vfMax: 1e-320, maxAmps: 1, maxWatts: 1 } } }],
  ])('%s', (_name, over) => {
    const r = checkKit({ ...worstCaseBuild(), ...over } as KitSpec);
    expectAllFinite(r);
  });
});
