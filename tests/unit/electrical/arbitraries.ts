// fast-check generators of valid specs. `wide` stretches every number across many decades to shake out
// overflow and division edge cases; the default stays in bench-realistic ranges.
import fc from 'fast-check';
import type { DriverSpec, KitSpec, StringSpec, SupplySpec } from '@/lib/electrical';

/** fast-check run counts, scaled down under mutation testing (FC_SCALE in its vitest config). */
export const runs = (n: number, min = 10) => Math.max(min, Math.round(n * Number(process.env.FC_SCALE ?? 1)));

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
/** Strictly above `min`: fast-check's minExcluded keeps the schema's open lower bounds out. */
const above = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true, minExcluded: true });

// `bench`: realistic bench values. `wide`: anywhere inside the schema's bounds, including the tiniest
// accepted values (subnormals such as 1e-310) and the caps themselves, to shake out overflow and
// division edge cases.
export type Range = 'bench' | 'wide';
const R = {
  bench: { volts: [0.5, 100], amps: [0.001, 20], small: [0.01, 10], ohms: [0.1, 10_000], watts: [0.01, 100], vf: [0.5, 12], henries: [1e-7, 1e-2], hz: [1e3, 5e6], len: [0.01, 100], tol: [0, 20], th: [0.1, 100], amb: [0, 40] },
  wide: { volts: [0, 1000], amps: [0, 100], small: [0, 1000], ohms: [0.01, 1e7], watts: [0, 1000], vf: [0, 60], henries: [1e-7, 1], hz: [1e3, 1e7], len: [0, 1000], tol: [0, 50], th: [0, 200], amb: [-20, 60] },
} as const;
const pos = (range: Range, r: readonly [number, number]) => (range === 'wide' || r[0] === 0 ? above(r[0], r[1]) : num(r[0], r[1]));

export function supplyArb(range: Range = 'bench'): fc.Arbitrary<SupplySpec> {
  const r = R[range];
  return fc.record(
    { volts: pos(range, r.volts), tolerancePct: num(r.tol[0], r.tol[1]), maxAmps: pos(range, r.amps), kind: fc.constant('dc' as const) },
    { requiredKeys: ['volts', 'maxAmps'] },
  );
}

export function driverArb(range: Range = 'bench'): fc.Arbitrary<DriverSpec> {
  const r = R[range];
  const buck = fc
    .record(
      {
        inputs: fc.tuple(pos(range, r.small), pos(range, r.volts)),
        outputAmps: pos(range, r.amps),
        headroomVolts: pos(range, r.small),
        maxDuty: above(0, 1),
        efficiency: above(0, 1),
        maxOutputVolts: pos(range, r.volts),
        inductorHenries: num(r.henries[0], r.henries[1]),
        switchingHz: num(r.hz[0], r.hz[1]),
        inductorSatAmps: pos(range, r.amps),
      },
      { requiredKeys: ['inputs', 'outputAmps'] },
    )
    .map(({ inputs, ...rest }): DriverSpec => {
      const [a, b] = inputs;
      return { type: 'buck', minInputVolts: Math.min(a, b), maxInputVolts: Math.max(a, b), ...rest };
    });
  const linear = fc
    .record(
      {
        maxInputVolts: pos(range, r.volts),
        outputAmps: pos(range, r.amps),
        dropoutVolts: pos(range, r.small),
        maxWatts: pos(range, r.watts),
        sinkCPerW: pos(range, r.th),
        junctionToCaseCPerW: pos(range, r.th),
        maxJunctionC: num(50, 200),
      },
      { requiredKeys: ['maxInputVolts', 'outputAmps', 'dropoutVolts'] },
    )
    .map((d): DriverSpec => ({ type: 'linear', ...d }));
  const resistor = fc
    .record({ ohms: num(r.ohms[0], r.ohms[1]), watts: pos(range, r.watts) })
    .map((d): DriverSpec => ({ type: 'resistor', ...d }));
  return fc.oneof(buck, linear, resistor);
}

export function stringArb(range: Range = 'bench', maxCount = 24): fc.Arbitrary<StringSpec> {
  const r = R[range];
  return fc
    .record(
      {
        count: fc.integer({ min: 1, max: range === 'wide' ? 200 : maxCount }),
        vf: fc.tuple(pos(range, r.vf), pos(range, r.vf), pos(range, r.vf)),
        maxAmps: pos(range, r.amps),
        maxWatts: pos(range, r.watts),
        thermalOhmsJs: pos(range, r.th),
        maxJunctionC: num(50, 200),
      },
      { requiredKeys: ['count', 'vf', 'maxAmps', 'maxWatts'] },
    )
    .map(({ count, vf, ...rest }) => {
      const [vfMin, vfTyp, vfMax] = [...vf].sort((a, b) => a - b);
      return { count, led: { vfMin, vfTyp, vfMax, ...rest } };
    });
}

export function kitSpecArb(range: Range = 'bench'): fc.Arbitrary<KitSpec> {
  const r = R[range];
  return fc.record(
    {
      supply: supplyArb(range),
      driver: driverArb(range),
      string: stringArb(range),
      pwmDuty: above(0, 1),
      wiring: fc.record({ lengthMeters: pos(range, r.len), awg: fc.integer({ min: -3, max: 40 }) }),
      heatSink: fc.record({ count: fc.integer({ min: 1, max: 50 }), cPerW: pos(range, r.th) }),
      ambientC: num(r.amb[0], r.amb[1]),
    },
    { requiredKeys: ['supply', 'driver', 'string'] },
  );
}

// ---------------------------------------------------------------------------------------------------
// Breaking a valid spec in one place, for the invalid-input tests (unit and HTTP).

export type Leaf = { path: string[]; atLeastZero: boolean };
const ZERO_OK = new Set(['tolerancePct', 'ambientC']);

/** Every numeric field of a spec, with whether zero is allowed there. */
export function numericLeaves(spec: KitSpec): Leaf[] {
  const out: Leaf[] = [];
  const walk = (o: Record<string, unknown>, path: string[]) => {
    for (const [k, v] of Object.entries(o)) {
      if (typeof v === 'number' && k !== 'awg' && k !== 'ambientC') out.push({ path: [...path, k], atLeastZero: ZERO_OK.has(k) });
      else if (v && typeof v === 'object') walk(v as Record<string, unknown>, [...path, k]);
    }
  };
  walk(spec as unknown as Record<string, unknown>, []);
  return out;
}

/** A copy of the spec with one field replaced (or removed, for `undefined`). */
export function withValueAt(spec: KitSpec, path: string[], value: unknown): unknown {
  const copy = structuredClone(spec) as unknown as Record<string, unknown>;
  let o = copy;
  for (const k of path.slice(0, -1)) o = o[k] as Record<string, unknown>;
  if (value === undefined) delete o[path[path.length - 1]];
  else o[path[path.length - 1]] = value;
  return copy;
}

// Kinds of bad value that survive JSON (NaN and Infinity do not: JSON.stringify turns them into null).
export const BAD_KINDS = ['negative', 'zero', 'text', 'null', 'object', 'boolean', 'missing'] as const;
export type BadKind = (typeof BAD_KINDS)[number] | 'nan' | 'infinity';

export function badValue(kind: BadKind, leaf: Leaf): unknown {
  switch (kind) {
    case 'zero':
      return leaf.atLeastZero ? -0.5 : 0;
    case 'negative':
      return -1.5;
    case 'text':
      return '12';
    case 'null':
      return null;
    case 'object':
      return {};
    case 'boolean':
      return true;
    case 'nan':
      return Number.NaN;
    case 'infinity':
      return Infinity;
    case 'missing':
      // optional fields may be left out; make them invalid instead
      return OPTIONAL.has(leaf.path[leaf.path.length - 1]) ? -1 : undefined;
  }
}
const OPTIONAL = new Set([
  'tolerancePct', 'headroomVolts', 'maxDuty', 'efficiency', 'maxOutputVolts', 'inductorHenries', 'switchingHz',
  'maxWatts', 'inductorSatAmps', 'sinkCPerW', 'junctionToCaseCPerW', 'maxJunctionC', 'thermalOhmsJs', 'pwmDuty',
]);

/** A JSON body that must be refused, and the field the refusal must name. */
export function malformedBodyArb(): fc.Arbitrary<{ body: string; field: string; what: string }> {
  const leafBroken = fc.tuple(kitSpecArb('bench'), fc.nat(), fc.constantFrom(...BAD_KINDS)).map(([spec, pick, kind]) => {
    const all = numericLeaves(spec);
    const leaf = all[pick % all.length];
    const field = leaf.path.join('.');
    return { body: JSON.stringify(withValueAt(spec, leaf.path, badValue(kind, leaf))), field, what: `${kind} ${field}` };
  });
  const shapeBroken = fc.tuple(kitSpecArb('bench'), fc.integer({ min: 0, max: 5 })).map(([spec, k]) => {
    const led = spec.string.led;
    const cases: [unknown, string, string][] = [
      [{ ...spec, driver: { type: 'boost' } }, 'driver.type', 'unknown driver type'],
      [{ ...spec, string: { ...spec.string, count: 2.5 } }, 'string.count', 'fractional LED count'],
      [{ ...spec, string: { ...spec.string, led: { ...led, vfMin: led.vfTyp * 1.5 } } }, 'string.led.vfMin', 'vfMin above vfTyp'],
      [{ ...spec, pwmDuty: 1.5 }, 'pwmDuty', 'duty above 1'],
      [{ ...spec, wiring: { lengthMeters: 1, awg: 99 } }, 'wiring.awg', 'gauge out of range'],
      [{ driver: spec.driver, string: spec.string }, 'supply', 'no supply'],
    ];
    const [body, field, what] = cases[k];
    return { body: JSON.stringify(body), field, what };
  });
  const notJson = fc.constantFrom('{"supply":', 'undefined', '', 'null', '[1,2,3]', '"24 V"').map((body) => ({
    body,
    field: '(body)',
    what: `body ${JSON.stringify(body)}`,
  }));
  return fc.oneof({ arbitrary: leafBroken, weight: 6 }, { arbitrary: shapeBroken, weight: 3 }, { arbitrary: notJson, weight: 1 });
}
