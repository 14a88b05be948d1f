import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { checkKit, kitSpecSchema, type KitSpec } from '@/lib/electrical';
import { buckSpec, linearSpec, resistorSpec } from './fixtures';

function issuePaths(run: () => unknown): string[] {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(ZodError);
    return (e as ZodError).issues.map((i) => i.path.join('.'));
  }
  throw new Error('expected a ZodError');
}

describe('kitSpecSchema defaults (the contract)', () => {
  it('fills tolerance 5 %, headroom 1.5 V, max duty 0.95 and efficiency 0.90', () => {
    const parsed = kitSpecSchema.parse({
      supply: { volts: 24, maxAmps: 2 },
      driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
      string: { count: 6, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } },
    });
    expect(parsed.supply.tolerancePct).toBe(5);
    expect(parsed.driver).toMatchObject({ headroomVolts: 1.5, maxDuty: 0.95, efficiency: 0.9 });
    expect(parsed.pwmDuty).toBeUndefined();
    expect(parsed.wiring).toBeUndefined();
  });

  it('takes the contract shape as written, all optional fields included', () => {
    const full: KitSpec = {
      supply: { volts: 24, tolerancePct: 3, maxAmps: 2 },
      driver: {
        type: 'buck',
        minInputVolts: 6,
        maxInputVolts: 36,
        outputAmps: 0.35,
        headroomVolts: 2,
        maxDuty: 0.9,
        efficiency: 0.85,
        maxOutputVolts: 34,
        inductorHenries: 68e-6,
        switchingHz: 300e3,
      },
      string: { count: 6, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } },
      pwmDuty: 1,
      wiring: { lengthMeters: 2, awg: 20 },
    };
    expect(kitSpecSchema.parse(full)).toMatchObject(full);
  });

  it('allows equal forward voltages and a duty of exactly 1', () => {
    expect(() => checkKit(buckSpec({ led: { vfMin: 3, vfTyp: 3, vfMax: 3 }, pwmDuty: 1 }))).not.toThrow();
  });
});

describe('invalid specs are rejected, naming the field', () => {
  const base = buckSpec();
  const cases: [string, unknown, string][] = [
    ['negative supply volts', { ...base, supply: { ...base.supply, volts: -12 } }, 'supply.volts'],
    ['zero supply volts', { ...base, supply: { ...base.supply, volts: 0 } }, 'supply.volts'],
    ['NaN supply current', { ...base, supply: { ...base.supply, maxAmps: Number.NaN } }, 'supply.maxAmps'],
    ['infinite supply current', { ...base, supply: { ...base.supply, maxAmps: Infinity } }, 'supply.maxAmps'],
    ['tolerance of 100 %', { ...base, supply: { ...base.supply, tolerancePct: 100 } }, 'supply.tolerancePct'],
    ['negative tolerance', { ...base, supply: { ...base.supply, tolerancePct: -1 } }, 'supply.tolerancePct'],
    ['volts as text', { ...base, supply: { ...base.supply, volts: '24' } }, 'supply.volts'],
    ['zero LEDs', { ...base, string: { ...base.string, count: 0 } }, 'string.count'],
    ['half an LED', { ...base, string: { ...base.string, count: 2.5 } }, 'string.count'],
    ['vfMin above vfTyp', { ...base, string: { ...base.string, led: { ...base.string.led, vfMin: 3.1 } } }, 'string.led.vfMin'],
    ['vfTyp above vfMax', { ...base, string: { ...base.string, led: { ...base.string.led, vfMax: 2.9 } } }, 'string.led.vfMax'],
    ['negative vfMin', { ...base, string: { ...base.string, led: { ...base.string.led, vfMin: -1 } } }, 'string.led.vfMin'],
    ['missing LED power', { ...base, string: { ...base.string, led: { ...base.string.led, maxWatts: undefined } } }, 'string.led.maxWatts'],
    ['PWM duty 0', { ...base, pwmDuty: 0 }, 'pwmDuty'],
    ['PWM duty above 1', { ...base, pwmDuty: 1.01 }, 'pwmDuty'],
    ['PWM duty negative', { ...base, pwmDuty: -0.5 }, 'pwmDuty'],
    ['unknown driver type', { ...base, driver: { type: 'boost', ohms: 1 } }, 'driver.type'],
    ['missing driver type', { ...base, driver: { maxInputVolts: 36 } }, 'driver.type'],
    ['buck without max input', { ...base, driver: { ...base.driver, maxInputVolts: undefined } }, 'driver.maxInputVolts'],
    ['buck min input above max', { ...base, driver: { ...base.driver, minInputVolts: 40 } }, 'driver.minInputVolts'],
    ['efficiency above 1', { ...base, driver: { ...base.driver, efficiency: 1.2 } }, 'driver.efficiency'],
    ['max duty 0', { ...base, driver: { ...base.driver, maxDuty: 0 } }, 'driver.maxDuty'],
    ['negative headroom', { ...base, driver: { ...base.driver, headroomVolts: -1 } }, 'driver.headroomVolts'],
    ['zero inductance', { ...base, driver: { ...base.driver, inductorHenries: 0 } }, 'driver.inductorHenries'],
    ['linear negative dropout', { ...linearSpec(), driver: { ...linearSpec().driver, dropoutVolts: -0.1 } }, 'driver.dropoutVolts'],
    ['resistor zero ohms', { ...resistorSpec(), driver: { type: 'resistor', ohms: 0, watts: 1 } }, 'driver.ohms'],
    ['resistor missing watts', { ...resistorSpec(), driver: { type: 'resistor', ohms: 100 } }, 'driver.watts'],
    ['wire gauge 41', { ...base, wiring: { lengthMeters: 2, awg: 41 } }, 'wiring.awg'],
    ['wire gauge 4.5', { ...base, wiring: { lengthMeters: 2, awg: 4.5 } }, 'wiring.awg'],
    ['negative wire length', { ...base, wiring: { lengthMeters: -2, awg: 18 } }, 'wiring.lengthMeters'],
    ['no supply', { driver: base.driver, string: base.string }, 'supply'],
  ];

  it.each(cases)('%s → %s', (_name, spec, path) => {
    expect(issuePaths(() => checkKit(spec as KitSpec))).toContain(path);
  });

  it('a body that is not an object names the whole body', () => {
    expect(issuePaths(() => checkKit(null as unknown as KitSpec))).toContain('');
    expect(issuePaths(() => checkKit([] as unknown as KitSpec))).toContain('');
  });
});
