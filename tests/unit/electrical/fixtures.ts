// Shared specs for the electrical tests. Tolerance 0 in the bases so each threshold sits at a round
// supply voltage; tests that exercise the tolerance band set it explicitly.
import type { Check, CheckId, KitReport, KitSpec } from '@/lib/electrical';

type Led = KitSpec['string']['led'];
export const LED: Led = { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.2, maxAmps: 1, maxWatts: 3 };

type Driver = KitSpec['driver'];
type Overrides<D extends Driver> = {
  supply?: Partial<KitSpec['supply']>;
  driver?: Partial<Omit<D, 'type'>>;
  led?: Partial<Led>;
  count?: number;
  pwmDuty?: number;
  wiring?: KitSpec['wiring'];
};

function build<D extends Driver>(supply: KitSpec['supply'], driver: D, count: number, over: Overrides<D>): KitSpec {
  return {
    supply: { ...supply, ...over.supply },
    driver: { ...driver, ...over.driver },
    string: { count: over.count ?? count, led: { ...LED, ...over.led } },
    ...(over.pwmDuty !== undefined ? { pwmDuty: over.pwmDuty } : {}),
    ...(over.wiring ? { wiring: over.wiring } : {}),
  };
}

/** 4 LEDs (11.2 / 12.0 / 12.8 V) on a 24 V supply through a 350 mA buck, 6–36 V in. */
export const buckSpec = (over: Overrides<Extract<Driver, { type: 'buck' }>> = {}) =>
  build(
    { volts: 24, tolerancePct: 0, maxAmps: 10 },
    { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35, headroomVolts: 1.5, maxDuty: 0.95, efficiency: 0.9 },
    4,
    over,
  );

/** 4 LEDs on 24 V through a 350 mA linear driver, 1 V dropout, rated 30 V in. */
export const linearSpec = (over: Overrides<Extract<Driver, { type: 'linear' }>> = {}) =>
  build({ volts: 24, tolerancePct: 0, maxAmps: 10 }, { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.0 }, 4, over);

/** 3 LEDs (8.4 / 9.0 / 9.6 V) through 100 Ω from 12 V. */
export const resistorSpec = (over: Overrides<Extract<Driver, { type: 'resistor' }>> = {}) =>
  build({ volts: 12, tolerancePct: 0, maxAmps: 10 }, { type: 'resistor', ohms: 100, watts: 1 }, 3, over);

export function checkOf(report: KitReport, id: CheckId): Check {
  const c = report.checks.find((x) => x.id === id);
  if (!c) throw new Error(`no check ${id} in [${report.checks.map((x) => x.id).join(', ')}]`);
  return c;
}
