// The physical caps of version 2: each bound accepted exactly at its edge and refused just past it, with
// the refusal naming the field. (Bounds are the contract's; they keep the maths finite.)
import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { type KitSpec, checkKit, kitSpecSchema } from '@/lib/electrical';
import { withValueAt } from './arbitraries';

const buck: KitSpec = {
  supply: { volts: 24, tolerancePct: 5, maxAmps: 2, kind: 'dc' },
  driver: {
    type: 'buck',
    minInputVolts: 6,
    maxInputVolts: 36,
    outputAmps: 0.35,
    headroomVolts: 1.5,
    maxDuty: 0.95,
    efficiency: 0.9,
    maxOutputVolts: 30,
    inductorHenries: 1e-4,
    switchingHz: 2e5,
    inductorSatAmps: 1,
  },
  string: { count: 4, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.2, maxAmps: 1, maxWatts: 3, thermalOhmsJs: 8, maxJunctionC: 125 } },
  pwmDuty: 1,
  wiring: { lengthMeters: 2, awg: 20 },
  heatSink: { count: 2, cPerW: 5 },
  ambientC: 25,
};
const linear: KitSpec = {
  ...buck,
  driver: { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1, maxWatts: 5, sinkCPerW: 5, junctionToCaseCPerW: 5, maxJunctionC: 125 },
};
const resistor: KitSpec = { ...buck, driver: { type: 'resistor', ohms: 100, watts: 1 } };

function refusedAt(spec: unknown): string[] {
  const r = kitSpecSchema.safeParse(spec);
  if (r.success) return [];
  return r.error.issues.map((i) => i.path.join('.'));
}

// [base, path, accepted edge values, refused values]
const CASES: [KitSpec, string, number[], number[]][] = [
  [buck, 'supply.volts', [Number.MIN_VALUE, 1000], [0, 1000.0001]],
  [buck, 'supply.tolerancePct', [0, 50], [-0.001, 50.001]],
  [buck, 'supply.maxAmps', [Number.MIN_VALUE, 100], [0, 100.001]],
  [buck, 'driver.minInputVolts', [Number.MIN_VALUE], [0]],
  [buck, 'driver.maxInputVolts', [1000], [1000.001]],
  [buck, 'driver.outputAmps', [Number.MIN_VALUE, 100], [0, 100.001]],
  [buck, 'driver.headroomVolts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [buck, 'driver.maxDuty', [Number.MIN_VALUE, 1], [0, 1.0001]],
  [buck, 'driver.efficiency', [Number.MIN_VALUE, 1], [0, 1.0001]],
  [buck, 'driver.maxOutputVolts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [buck, 'driver.inductorHenries', [1e-7, 1], [0.99e-7, 1.001]],
  [buck, 'driver.switchingHz', [1e3, 1e7], [999, 1.0001e7, 300]],
  [buck, 'driver.inductorSatAmps', [Number.MIN_VALUE, 100], [0, 100.001]],
  [linear, 'driver.maxInputVolts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [linear, 'driver.dropoutVolts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [linear, 'driver.maxWatts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [linear, 'driver.sinkCPerW', [Number.MIN_VALUE, 200], [0, 200.001]],
  [linear, 'driver.junctionToCaseCPerW', [Number.MIN_VALUE, 200], [0, 200.001]],
  [linear, 'driver.maxJunctionC', [50, 200], [49.99, 200.01]],
  [resistor, 'driver.ohms', [0.01, 1e7], [0.0099, 1.0001e7]],
  [resistor, 'driver.watts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [buck, 'string.count', [1, 200], [0, 201, 2.5]],
  [buck, 'string.led.maxAmps', [Number.MIN_VALUE, 100], [0, 100.001]],
  [buck, 'string.led.maxWatts', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [buck, 'string.led.thermalOhmsJs', [Number.MIN_VALUE, 200], [0, 200.001]],
  [buck, 'string.led.maxJunctionC', [50, 200], [49.99, 200.01]],
  [buck, 'pwmDuty', [Number.MIN_VALUE, 1], [0, 1.0001]],
  [buck, 'wiring.lengthMeters', [Number.MIN_VALUE, 1000], [0, 1000.001]],
  [buck, 'wiring.awg', [-3, 40], [-4, 41, 20.5]],
  [buck, 'heatSink.count', [1, 50], [0, 51, 1.5]],
  [buck, 'heatSink.cPerW', [Number.MIN_VALUE, 200], [0, 200.001]],
  [buck, 'ambientC', [-20, 60], [-20.01, 60.01]],
];

describe('every bound: accepted at its edge, refused past it, naming the field', () => {
  it.each(CASES)('%#: %s', (base, path, accepted, refused) => {
    const keys = path.split('.');
    for (const v of accepted) expect(refusedAt(withValueAt(base, keys, v)), `${path} = ${v}`).toEqual([]);
    for (const v of refused) expect(refusedAt(withValueAt(base, keys, v)), `${path} = ${v}`).toContain(path);
  });

  it('forward voltages: (0, 60] V each, in order', () => {
    const led = buck.string.led;
    const at = (l: Partial<typeof led>) => refusedAt({ ...buck, string: { ...buck.string, led: { ...led, ...l } } });
    expect(at({ vfMin: 60, vfTyp: 60, vfMax: 60 })).toEqual([]);
    expect(at({ vfMax: 60.01 })).toContain('string.led.vfMax');
    expect(at({ vfMin: 0 })).toContain('string.led.vfMin');
    expect(at({ vfTyp: 3.3 })).toContain('string.led.vfMax');
    expect(at({ vfMin: 3.1 })).toContain('string.led.vfMin');
  });

  it('every field at its most extreme accepted value still gives a finite report', () => {
    for (const base of [buck, linear, resistor])
      for (const [b, path, accepted] of CASES.filter(([b]) => b === base))
        for (const v of accepted) {
          const r = checkKit(withValueAt(b, path.split('.'), v) as KitSpec);
          expect(JSON.stringify(r)).not.toContain('null');
        }
  });

  it('the full contract shape parses as written', () => {
    for (const spec of [buck, linear, resistor]) expect(kitSpecSchema.parse(spec)).toEqual(spec);
  });

  it('unknown keys are refused at every level, by their own path', () => {
    const cases: [unknown, string][] = [
      [{ ...buck, extra: 1 }, 'extra'],
      [{ ...buck, supply: { ...buck.supply, type: 'ac' } }, 'supply.type'],
      [{ ...buck, driver: { ...buck.driver, dropoutVolts: 1 } }, 'driver.dropoutVolts'],
      [{ ...linear, driver: { ...linear.driver, efficiency: 0.9 } }, 'driver.efficiency'],
      [{ ...resistor, driver: { ...resistor.driver, maxWatts: 1 } }, 'driver.maxWatts'],
      [{ ...buck, string: { ...buck.string, colour: 'red' } }, 'string.colour'],
      [{ ...buck, wiring: { ...buck.wiring, gauge: 20 } }, 'wiring.gauge'],
      [{ ...buck, heatSink: { ...buck.heatSink, material: 'Al' } }, 'heatSink.material'],
    ];
    for (const [spec, path] of cases) {
      const r = kitSpecSchema.safeParse(spec);
      expect(r.success).toBe(false);
      const issue = (r.error as ZodError).issues.find((i) => i.path.join('.') === path);
      expect(issue?.message).toMatch(/Unknown field/);
    }
  });

  it('the supply kind may only be "dc"', () => {
    expect(refusedAt({ ...buck, supply: { ...buck.supply, kind: 'ac' } })).toContain('supply.kind');
    expect(refusedAt({ ...buck, supply: { ...buck.supply, kind: 'DC' } })).toContain('supply.kind');
  });

  it('a switching frequency typed in kHz is refused with the unit in the message', () => {
    const r = kitSpecSchema.safeParse(withValueAt(buck, ['driver', 'switchingHz'], 300));
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toMatch(/hertz/);
  });
});
