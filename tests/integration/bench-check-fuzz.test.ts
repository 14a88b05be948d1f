// 10,000 generated bodies to each of POST /api/bench-check and /compare through real HTTP (keep-alive,
// a few requests in flight). Most start from a valid build and are bent at one to three places: an
// extreme float (1e308, -0, 5e-324, 1e-310, a literal that parses to Infinity), a huge integer, a
// string, null, nested junk, an unknown key at any level, a missing key. The rest are junk outright.
// None may answer 5xx; every 4xx names a field; every 2xx has no NaN, Infinity or null anywhere.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { firstNonFinite } from '@/lib/bench-check';
import { BASE } from '../helpers/http';

// 1,000 bodies per route in `npm test` keeps the suite inside CI's time; the 10,000 is
// `OHM_BENCH_FUZZ_RUNS=10000 npm test -- tests/integration/bench-check-fuzz.test.ts`.
const RUNS = Number(process.env.OHM_BENCH_FUZZ_RUNS ?? 1_000);
const IN_FLIGHT = 6;
const SEED = 20_261_202;

// Raw JSON text for values JSON.stringify cannot write: they are swapped in after stringifying.
const RAW: Record<string, string> = {
  '@@negzero': '-0',
  '@@overflow': '1e400', // parses to Infinity
  '@@neg-overflow': '-1e400',
  '@@underflow': '1e-400', // parses to 0
  '@@bigint': '123456789012345678901234567890123',
  '@@long-fraction': '0.' + '3'.repeat(400),
};
const serialize = (v: unknown) => JSON.stringify(v).replace(/"(@@[a-z-]+)"/g, (m, k: string) => RAW[k] ?? m);

const extremeNumber = fc.constantFrom(
  1e308, -1e308, 1.7976931348623157e308, 5e-324, -5e-324, 1e-310, 2 ** 53 + 2, -(2 ** 53), 2 ** 31, 1e21, 0, -1,
  1e-9, 1e-7, 0.01, 1000, 1000.0000001, 200, 201, 50, 60, 60.000001, 100, 100.0001, -20, -20.5, 1e3, 1e7, 1e7 + 1,
  '@@negzero', '@@overflow', '@@neg-overflow', '@@underflow', '@@bigint', '@@long-fraction',
);
const junk = fc.oneof(
  extremeNumber,
  fc.double(),
  fc.integer(),
  fc.constantFrom('', '1e308', '3,2', 'twelve', ' 5 ', 'NaN', 'Infinity', '-0', null, true, false, [], {}, [1, 2], { volts: 12 }),
  fc.string({ maxLength: 20 }),
  fc.jsonValue({ maxDepth: 3 }),
);
const unknownKey = fc.constantFrom('kind', 'type', 'efficency', 'tolerance', 'pwm', 'extra', '__proto__', 'constructor', 'volt', 'Volts', 'cPerW', 'count', '');

const led = fc.record({
  vfMin: fc.double({ min: 1.5, max: 3, noNaN: true }),
  vfTyp: fc.constant(3.1),
  vfMax: fc.double({ min: 3.2, max: 4, noNaN: true }),
  maxAmps: fc.constantFrom(0.35, 0.7, 1, 1.5),
  maxWatts: fc.constantFrom(1, 3, 5),
  thermalOhmsJs: fc.constantFrom(3, 8, 15, 200),
  maxJunctionC: fc.constantFrom(50, 125, 150, 200),
}, { requiredKeys: ['vfMin', 'vfTyp', 'vfMax', 'maxAmps', 'maxWatts'] });
const supply = fc.record({
  volts: fc.constantFrom(5, 12, 24, 36, 48, 58, 1000),
  tolerancePct: fc.constantFrom(0, 5, 10, 50),
  maxAmps: fc.constantFrom(0.5, 2, 10, 100),
  kind: fc.constant('dc'),
}, { requiredKeys: ['volts', 'maxAmps'] });
const stringSpec = fc.record({ count: fc.integer({ min: 1, max: 200 }), led });
const driver = fc.oneof(
  fc.record({
    type: fc.constant('buck'), minInputVolts: fc.constantFrom(4, 6, 8), maxInputVolts: fc.constantFrom(36, 60, 1000),
    outputAmps: fc.constantFrom(0.35, 0.7, 1, 3, 100), headroomVolts: fc.constantFrom(0, 1.5, 3), maxDuty: fc.constantFrom(0.5, 0.95, 1),
    efficiency: fc.constantFrom(0.01, 0.85, 1), maxOutputVolts: fc.constantFrom(12, 48, 1000),
    inductorHenries: fc.constantFrom(1e-7, 4.7e-5, 1), switchingHz: fc.constantFrom(1e3, 3e5, 1e7), inductorSatAmps: fc.constantFrom(0.5, 2, 100),
  }, { requiredKeys: ['type', 'minInputVolts', 'maxInputVolts', 'outputAmps'] }),
  fc.record({
    type: fc.constant('linear'), maxInputVolts: fc.constantFrom(30, 60, 1000), outputAmps: fc.constantFrom(0.35, 1, 100),
    dropoutVolts: fc.constantFrom(0, 1.2, 5), maxWatts: fc.constantFrom(1, 10, 1000), sinkCPerW: fc.constantFrom(0.1, 5, 200),
    junctionToCaseCPerW: fc.constantFrom(1, 5, 200), maxJunctionC: fc.constantFrom(50, 125, 200),
  }, { requiredKeys: ['type', 'maxInputVolts', 'outputAmps', 'dropoutVolts'] }),
  fc.record({ type: fc.constant('resistor'), ohms: fc.constantFrom(0.01, 33, 1e7), watts: fc.constantFrom(0.25, 2, 1000) }),
);
const kitBody = fc.record({
  supply, driver, string: stringSpec,
  pwmDuty: fc.constantFrom(5e-324, 0.01, 0.5, 1),
  wiring: fc.record({ lengthMeters: fc.constantFrom(0.1, 2, 1000), awg: fc.constantFrom(-3, 10, 22, 40) }),
  heatSink: fc.record({ count: fc.integer({ min: 1, max: 50 }), cPerW: fc.constantFrom(0.1, 2, 10, 200) }),
  ambientC: fc.constantFrom(-20, 25, 60),
}, { requiredKeys: ['supply', 'driver', 'string'] });
const compareBody = fc.record({
  string: stringSpec, supply,
  amps: fc.constantFrom(1e-4, 0.35, 1, 100),
  pwmDuty: fc.constantFrom(5e-324, 0.5, 1),
  wiring: fc.record({ lengthMeters: fc.constantFrom(0.1, 2, 1000), awg: fc.constantFrom(-3, 22, 40) }),
  heatSink: fc.record({ count: fc.integer({ min: 1, max: 50 }), cPerW: fc.constantFrom(0.1, 10, 200) }),
  ambientC: fc.constantFrom(-20, 25, 60),
}, { requiredKeys: ['string', 'supply'] });

type Json = unknown;
type Edit = { kind: 'leaf' | 'unknown' | 'delete' | 'subtree'; pick: number; value: Json; key: string };
const edit: fc.Arbitrary<Edit> = fc.record({
  kind: fc.constantFrom('leaf', 'leaf', 'leaf', 'unknown', 'delete', 'subtree'),
  pick: fc.nat(),
  value: junk,
  key: unknownKey,
});

/** Every object in the tree with its path, root first. */
function objects(v: Json, path: string[] = []): { obj: Record<string, Json>; path: string[] }[] {
  if (!v || typeof v !== 'object' || Array.isArray(v)) return [];
  const o = v as Record<string, Json>;
  return [{ obj: o, path }, ...Object.entries(o).flatMap(([k, c]) => objects(c, [...path, k]))];
}

function bend(body: Json, edits: Edit[]): Json {
  const copy = structuredClone(body) as Record<string, Json>;
  for (const edit of edits) {
    // constantFrom hands out the same object each time: insert a copy, never the shared one.
    const e = { ...edit, value: structuredClone(edit.value) };
    const all = objects(copy);
    const target = all[e.pick % all.length].obj;
    const keys = Object.keys(target);
    if (e.kind === 'unknown' || keys.length === 0) {
      Object.defineProperty(target, e.key, { value: e.value ?? 1, enumerable: true, writable: true, configurable: true });
      continue;
    }
    const key = keys[e.pick % keys.length];
    if (e.kind === 'delete') delete target[key];
    else if (e.kind === 'leaf' && typeof target[key] === 'object' && target[key] !== null) {
      const inner = target[key] as Record<string, Json>;
      const ik = Object.keys(inner);
      if (ik.length) inner[ik[e.pick % ik.length]] = e.value;
    } else target[key] = e.value;
  }
  return copy;
}

/** Request bodies as the text sent. */
const bodiesFor = (valid: fc.Arbitrary<Json>): fc.Arbitrary<string> =>
  fc.oneof(
    { weight: 20, arbitrary: valid.map(serialize) }, // near the accepted edges: the 2xx path must stay finite
    { weight: 70, arbitrary: fc.tuple(valid, fc.array(edit, { minLength: 1, maxLength: 3 })).map(([b, e]) => serialize(bend(b, e))) },
    { weight: 8, arbitrary: junk.map(serialize) },
    { weight: 2, arbitrary: fc.oneof(fc.constantFrom('', '{', '{"supply":', '\u0000', 'NaN', '{"a":1}'.repeat(3)), fc.string({ maxLength: 60 })) },
  );

type Outcome = { status: number; problem: string | null };

async function send(path: string, text: string): Promise<Outcome> {
  const res = await fetch(BASE + path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: text });
  const raw = await res.text();
  let json: { error?: { code?: string; message?: string; fields?: Record<string, string[]> } } | null = null;
  try {
    json = JSON.parse(raw);
  } catch {
    return { status: res.status, problem: `answer is not JSON: ${raw.slice(0, 120)}` };
  }
  if (res.status >= 500) return { status: res.status, problem: `${res.status} ${raw.slice(0, 200)}` };
  if (res.status >= 400) {
    const fields = Object.keys(json?.error?.fields ?? {});
    if (!json?.error?.code || !json.error.message) return { status: res.status, problem: `4xx without code/message: ${raw.slice(0, 200)}` };
    if (fields.length === 0) return { status: res.status, problem: `4xx naming no field: ${raw.slice(0, 200)}` };
    // The service's last-resort answer: an accepted body whose maths overflowed or threw. A rule bug.
    if (/outside what the check can compute/.test(json.error.message)) return { status: res.status, problem: `accepted but not computable: ${raw.slice(0, 200)}` };
    return { status: res.status, problem: null };
  }
  const bad = firstNonFinite(json);
  return { status: res.status, problem: bad ? `2xx with a non-finite or null ${bad}` : null };
}

async function fuzz(path: string, texts: string[]) {
  const tally: Record<string, number> = {};
  const problems: string[] = [];
  let next = 0;
  const started = performance.now();
  await Promise.all(
    Array.from({ length: IN_FLIGHT }, async () => {
      while (next < texts.length) {
        const text = texts[next++];
        const { status, problem } = await send(path, text);
        tally[status] = (tally[status] ?? 0) + 1;
        if (problem && problems.length < 20) problems.push(`${problem}\n    body: ${text.slice(0, 400)}`);
      }
    }),
  );
  const seconds = (performance.now() - started) / 1000;
  console.info(`${path}: ${texts.length} bodies in ${seconds.toFixed(1)} s, statuses ${JSON.stringify(tally)}`);
  return { tally, problems };
}

describe('bench-check routes under 10,000 generated bodies each', () => {
  it('POST /api/bench-check: no 5xx, every 4xx names a field, every 2xx is finite', async () => {
    const bodies = fc.sample(bodiesFor(kitBody), { numRuns: RUNS, seed: SEED });
    const { tally, problems } = await fuzz('/api/bench-check', bodies);
    expect(problems).toEqual([]);
    // The generator reaches both sides: accepted builds and refused ones.
    expect(tally[200] ?? 0).toBeGreaterThan(RUNS / 20);
    expect(tally[400] ?? 0).toBeGreaterThan(RUNS / 2);
  }, 600_000);

  it('POST /api/bench-check/compare: no 5xx, every 4xx names a field, every 2xx is finite', async () => {
    const bodies = fc.sample(bodiesFor(compareBody), { numRuns: RUNS, seed: SEED + 1 });
    const { tally, problems } = await fuzz('/api/bench-check/compare', bodies);
    expect(problems).toEqual([]);
    expect(tally[200] ?? 0).toBeGreaterThan(RUNS / 20);
    expect(tally[400] ?? 0).toBeGreaterThan(RUNS / 2);
  }, 600_000);
});
