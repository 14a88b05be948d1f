// "What on the shelf works with this": rank supply × driver pairs for an LED string, best first.
//
// The full check costs microseconds and a big shelf has millions of pairs, so the search narrows first
// (rankPlans.ts has the bounds):
//  1. each driver alone: its set current and power per LED must fit the LED, its output range the string;
//     drivers are then visited best bound first;
//  2. each driver's supply window: supplies sorted by their low end, binary search to the first whose low
//     end gives the string enough voltage, scan while the low end is under the driver's input rating —
//     and once the list holds `limit` ok pairs, the window narrows to supplies that could beat the last;
//  3. an upper bound on each pair's margin from the checks that are cheap; full checks in order of bound,
//     skipping any pair whose bound is under the last ok pair's margin.
// Only pairs that would certainly fail are dropped, and only pairs that cannot reach the list are left
// unchecked, so the answer equals the naive loop's (a test and bench/suggest.ts compare them).
import { loopOhms } from './awg';
import { VERDICT_RANK, checkMargin } from './checks';
import { evaluateKit } from './checkKit';
import type { KitReport } from './report';
import { supplyWindow } from './circuit';
import { MaxHeap } from './heap';
import { planFor, type PreparedSupply } from './rankPlans';
import {
  type DriverSpec,
  type ResolvedDriver,
  type ResolvedKitSpec,
  type ResolvedString,
  type ResolvedSupply,
  type ResolvedWiring,
  type StringSpec,
  type SupplySpec,
  type WiringSpec,
  driverSpecSchema,
  stringSpecSchema,
  supplySpecSchema,
  wiringSpecSchema,
  kitSpecSchema,
  DEFAULT_AMBIENT_C,
} from './schema';

export type ShelfSupply = { id: string; supply: SupplySpec };
export type ShelfDriver = { id: string; driver: DriverSpec };

/** Shelf records are read as immutable (their parsed specs are cached by object). */
export type RankQuery = {
  string: StringSpec;
  supplies: ShelfSupply[];
  drivers: ShelfDriver[];
  fixedSupplyId?: string;
  fixedDriverId?: string;
  /** How many to return; default 20. */
  limit?: number;
  pwmDuty?: number;
  wiring?: WiringSpec;
};

export type Candidate = {
  supplyId: string;
  driverId: string;
  verdict: 'ok' | 'caution';
  /** The smallest margin over all checks, as a fraction of each check's limit. */
  margin: number;
  report: KitReport;
};

export type RankResult = {
  candidates: Candidate[];
  /** Shelf records whose specs do not parse; they are left out rather than failing the search. */
  skippedIds: string[];
  /** Full checks run (for the benchmark). */
  checked: number;
};

type Prepared = {
  string: ResolvedString;
  supplies: PreparedSupply[];
  drivers: { id: string; spec: ResolvedDriver }[];
  limit: number;
  pwmDuty?: number;
  wiring?: ResolvedWiring;
  skippedIds: string[];
};

// Parsed shelf records, by record object: a shelf kept in memory and asked about several strings is
// validated once. Records are read as immutable — a changed part must be a new object.
const parsedSupplies = new WeakMap<object, ResolvedSupply | null>();
const parsedDrivers = new WeakMap<object, ResolvedDriver | null>();

function cachedParse<T>(cache: WeakMap<object, T | null>, raw: unknown, parse: (raw: unknown) => T | null): T | null {
  if (typeof raw !== 'object' || raw === null) return parse(raw);
  let hit = cache.get(raw);
  if (hit === undefined) {
    hit = parse(raw);
    cache.set(raw, hit);
  }
  return hit;
}
const parseSupply = (raw: unknown) => {
  const r = supplySpecSchema.safeParse(raw);
  return r.success ? r.data : null;
};
const parseDriver = (raw: unknown) => {
  const r = driverSpecSchema.safeParse(raw);
  return r.success ? r.data : null;
};

function prepare(q: RankQuery): Prepared {
  const string = stringSpecSchema.parse(q.string);
  const pwmDuty = q.pwmDuty === undefined ? undefined : kitSpecSchema.shape.pwmDuty.parse(q.pwmDuty);
  const wiring = q.wiring === undefined ? undefined : wiringSpecSchema.parse(q.wiring);
  const limit = q.limit ?? 20;
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError('limit must be a whole number of at least 1');
  const skippedIds: string[] = [];
  const supplies: Prepared['supplies'] = [];
  for (const s of q.supplies) {
    if (q.fixedSupplyId !== undefined && s.id !== q.fixedSupplyId) continue;
    const spec = cachedParse(parsedSupplies, s.supply, parseSupply);
    if (!spec) {
      skippedIds.push(s.id);
      continue;
    }
    const w = supplyWindow(spec);
    supplies.push({ id: s.id, spec, low: w.low, high: w.high });
  }
  const drivers: Prepared['drivers'] = [];
  for (const d of q.drivers) {
    if (q.fixedDriverId !== undefined && d.id !== q.fixedDriverId) continue;
    const spec = cachedParse(parsedDrivers, d.driver, parseDriver);
    if (!spec) skippedIds.push(d.id);
    else drivers.push({ id: d.id, spec });
  }
  return { string, supplies, drivers, limit, pwmDuty, wiring, skippedIds };
}

function specOf(p: Prepared, supply: ResolvedSupply, driver: ResolvedDriver): ResolvedKitSpec {
  return {
    supply,
    driver,
    string: p.string,
    ambientC: DEFAULT_AMBIENT_C,
    ...(p.pwmDuty !== undefined ? { pwmDuty: p.pwmDuty } : {}),
    ...(p.wiring !== undefined ? { wiring: p.wiring } : {}),
  };
}

/** A pair that passed, before its report is written out. */
type Entry = { supplyId: string; driverId: string; verdict: 'ok' | 'caution'; margin: number; spec: ResolvedKitSpec };

function entryOf(supplyId: string, driverId: string, spec: ResolvedKitSpec): Entry | null {
  const report = evaluateKit(spec, { messages: false });
  if (report.verdict === 'fail') return null;
  let margin = Infinity;
  for (const c of report.checks) margin = Math.min(margin, checkMargin(c));
  return { supplyId, driverId, verdict: report.verdict, margin, spec };
}

/** ok before caution, then the roomiest first; ids settle ties so the order is stable. */
export function compareCandidates(a: Omit<Candidate, 'report'>, b: Omit<Candidate, 'report'>): number {
  return (
    VERDICT_RANK[a.verdict] - VERDICT_RANK[b.verdict] ||
    b.margin - a.margin ||
    (a.supplyId < b.supplyId ? -1 : a.supplyId > b.supplyId ? 1 : 0) ||
    (a.driverId < b.driverId ? -1 : a.driverId > b.driverId ? 1 : 0)
  );
}

/** Keeps `top` sorted and at most `limit` long. */
function offer(top: Entry[], e: Entry, limit: number): void {
  if (top.length >= limit && compareCandidates(e, top[top.length - 1]) >= 0) return;
  let lo = 0;
  let hi = top.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (compareCandidates(top[mid], e) <= 0) lo = mid + 1;
    else hi = mid;
  }
  top.splice(lo, 0, e);
  if (top.length > limit) top.pop();
}

/** The winners get their full report, messages included. */
function finish(top: Entry[], p: Prepared, checked: number): RankResult {
  return {
    candidates: top.map(({ spec, ...e }) => ({ ...e, report: evaluateKit(spec) })),
    skippedIds: p.skippedIds,
    checked,
  };
}

/** The baseline: the full check on every supply × driver pair. */
export function rankCandidatesNaive(q: RankQuery): RankResult {
  const p = prepare(q);
  const top: Entry[] = [];
  let checked = 0;
  for (const s of p.supplies)
    for (const d of p.drivers) {
      checked++;
      const e = entryOf(s.id, d.id, specOf(p, s.spec, d.spec));
      if (e) offer(top, e, p.limit);
    }
  return finish(top, p, checked);
}

/** The pruned search; same answers as rankCandidatesNaive. */
export function rankCandidates(q: RankQuery): RankResult {
  const p = prepare(q);
  const wireOhms = p.wiring ? loopOhms(p.wiring.lengthMeters, p.wiring.awg) : 0;
  const supplies = [...p.supplies].sort((a, b) => a.low - b.low);
  const lows = Float64Array.from(supplies, (s) => s.low);

  const plans = p.drivers
    .map((d) => ({ d, plan: planFor(d.spec, p.string, p.pwmDuty, wireOhms) }))
    .filter((x): x is { d: Prepared['drivers'][number]; plan: NonNullable<ReturnType<typeof planFor>> } => x.plan !== null)
    .sort((a, b) => b.plan.driverBound - a.plan.driverBound);

  const top: Entry[] = [];
  let checked = 0;
  // Margin a pair must reach to enter a list already full of ok pairs; -∞ until then.
  const bar = () => (top.length === p.limit && top[p.limit - 1].verdict === 'ok' ? top[p.limit - 1].margin : -Infinity);
  type Pending = { s: PreparedSupply; d: Prepared['drivers'][number]; bound: number };
  const pending = new MaxHeap<Pending>((x) => x.bound);
  const run = ({ s, d }: Pending) => {
    checked++;
    const e = entryOf(s.id, d.id, specOf(p, s.spec, d.spec));
    if (e) offer(top, e, p.limit);
  };

  for (let k = 0; k < plans.length; k++) {
    const { d, plan } = plans[k];
    if (plan.driverBound < bar()) break; // sorted: no later driver can do better
    const { lowFrom, highTo } = plan.window(bar());
    let lo = 0;
    let hi = lows.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (lows[mid] < lowFrom) lo = mid + 1;
      else hi = mid;
    }
    // A supply's high end is at least its low end, so the scan stops once the low end passes highTo.
    for (let si = lo; si < supplies.length && supplies[si].low <= highTo; si++) {
      const s = supplies[si];
      if (s.high > highTo) continue;
      const bound = plan.bound(s);
      if (bound !== null && bound >= bar()) pending.push({ s, d, bound });
    }
    // Check pairs best bound first. A pair no later driver can beat is due now; until the list is full
    // of ok pairs, check greedily so that a bar exists to narrow the next windows.
    const nextDriverBound = k + 1 < plans.length ? plans[k + 1].plan.driverBound : -Infinity;
    while (pending.size && (pending.peek()!.bound >= nextDriverBound || bar() === -Infinity)) {
      const x = pending.pop()!;
      if (x.bound < bar()) {
        pending.clear();
        break;
      }
      run(x);
    }
  }
  while (pending.size) {
    const x = pending.pop()!;
    if (x.bound < bar()) break;
    run(x);
  }
  return finish(top, p, checked);
}
