// "What on the shelf works with this": rank supply × driver pairs for an LED string, best first, the way
// a bench would choose. Every pair is judged by the full check (evaluateKit — the same rules, no second
// copy); among the passing ones the order is:
//  1. ok before caution;
//  2. the driver that runs the LEDs nearest their rated current (set current / LED rating, in 5 % steps):
//     a free 700 mA driver for 1 A LEDs beats a 350 mA one — both pass, but one gives twice the light;
//  3. the supply used sensibly: the one whose current rating the build uses most (in 10 % steps, and ok
//     already keeps it under 80 %), so a small supply is not passed over for the shelf's biggest;
//  4. then the most margin over all checks, and the ids, so the order is stable.
// Each candidate carries a short reason.
//
// The search is exact but narrowed: pairs that certainly fail are not checked (a supply window per driver
// from the checks that only get worse at the window's ends), and the rest are checked best bound first
// (branch and bound, below) — once the list is full and its last entry ranks before every bound left, the
// rest cannot enter. rank-oracle.test.ts and bench/suggest.ts compare the answers with the naive loop's.
import { VERDICT_RANK, checkMargin, isAbove, isBelow, verdictAtMost } from './checks';
import { evaluateKit } from './checkKit';
import type { KitReport } from './report';
import { constantPowerDraw, resistorAmps, stringVolts, supplyWindow } from './circuit';
import { loopOhms } from './awg';
import { formatAmps, formatPercent } from './format';
import {
  type DriverSpec,
  type HeatSinkSpec,
  type ResolvedDriver,
  type ResolvedHeatSink,
  type ResolvedKitSpec,
  type ResolvedString,
  type ResolvedSupply,
  type ResolvedWiring,
  type StringSpec,
  type SupplySpec,
  type WiringSpec,
  DEFAULT_AMBIENT_C,
  ambientCSchema,
  driverSpecSchema,
  heatSinkSpecSchema,
  pwmDutySchema,
  stringSpecSchema,
  supplySpecSchema,
  wiringSpecSchema,
} from './schema';
import { SELV_DC_LIMIT_VOLTS, SUPPLY_CURRENT_CAUTION_FRACTION } from './thresholds';

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
  heatSink?: HeatSinkSpec;
  ambientC?: number;
};

export type Candidate = {
  supplyId: string;
  driverId: string;
  verdict: 'ok' | 'caution';
  /** How near the LEDs' rated current the driver runs them (set current / rating), in 5 % steps. */
  drive: number;
  /** Share of the supply's current rating the build draws, in 10 % steps. */
  supplyUse: number;
  /** The smallest margin over all checks, as a fraction of each check's limit. */
  margin: number;
  /** Why it stands where it does, in a few words. */
  reason: string;
  report: KitReport;
};

export type RankResult = {
  candidates: Candidate[];
  /** Shelf records whose specs do not parse; they are left out rather than failing the search. */
  skippedIds: string[];
  /** Full checks run (for the benchmark). */
  checked: number;
};

type PreparedSupply = { id: string; spec: ResolvedSupply; low: number; high: number };
type PreparedDriver = { id: string; spec: ResolvedDriver };
type Prepared = {
  string: ResolvedString;
  supplies: PreparedSupply[];
  drivers: PreparedDriver[];
  limit: number;
  pwmDuty?: number;
  wiring?: ResolvedWiring;
  heatSink?: ResolvedHeatSink;
  ambientC: number;
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

// A shelf part's stored specs may carry fields of their own (a name, a sink's °C/W); the check's strict
// schema is for what a person types, so shelf records keep only the fields the check knows.
const SUPPLY_KEYS = Object.keys(supplySpecSchema.shape);
const DRIVER_KEYS: Record<string, string[]> = Object.fromEntries(
  driverSpecSchema.options.map((o) => [String(o.shape.type.value), Object.keys(o.shape)]),
);
function only(raw: unknown, keys: string[] | undefined): unknown {
  if (typeof raw !== 'object' || raw === null || !keys) return raw;
  return Object.fromEntries(Object.entries(raw).filter(([k]) => keys.includes(k)));
}
const parseSupply = (raw: unknown) => {
  const r = supplySpecSchema.safeParse(only(raw, SUPPLY_KEYS));
  return r.success ? r.data : null;
};
const parseDriver = (raw: unknown) => {
  const type = typeof raw === 'object' && raw !== null ? (raw as { type?: unknown }).type : undefined;
  const r = driverSpecSchema.safeParse(only(raw, DRIVER_KEYS[String(type)]));
  return r.success ? r.data : null;
};

function prepare(q: RankQuery): Prepared {
  const string = stringSpecSchema.parse(q.string);
  const pwmDuty = q.pwmDuty === undefined ? undefined : pwmDutySchema.parse(q.pwmDuty);
  const wiring = q.wiring === undefined ? undefined : wiringSpecSchema.parse(q.wiring);
  const heatSink = q.heatSink === undefined ? undefined : heatSinkSpecSchema.parse(q.heatSink);
  const ambientC = q.ambientC === undefined ? DEFAULT_AMBIENT_C : ambientCSchema.parse(q.ambientC);
  const limit = q.limit ?? 20;
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError('limit must be a whole number of at least 1');
  const skippedIds: string[] = [];
  const supplies: PreparedSupply[] = [];
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
  const drivers: PreparedDriver[] = [];
  for (const d of q.drivers) {
    if (q.fixedDriverId !== undefined && d.id !== q.fixedDriverId) continue;
    const spec = cachedParse(parsedDrivers, d.driver, parseDriver);
    if (!spec) skippedIds.push(d.id);
    else drivers.push({ id: d.id, spec });
  }
  return { string, supplies, drivers, limit, pwmDuty, wiring, heatSink, ambientC, skippedIds };
}

function specOf(p: Prepared, supply: ResolvedSupply, driver: ResolvedDriver): ResolvedKitSpec {
  return {
    supply,
    driver,
    string: p.string,
    ambientC: p.ambientC,
    ...(p.pwmDuty !== undefined ? { pwmDuty: p.pwmDuty } : {}),
    ...(p.wiring !== undefined ? { wiring: p.wiring } : {}),
    ...(p.heatSink !== undefined ? { heatSink: p.heatSink } : {}),
  };
}

const DRIVE_STEP = 0.05;
const SUPPLY_STEP = 0.1;
// Steps are counted with a little slack so that float dust (0.7 / 1 = 0.7000000000000001) stays in its step.
const step = (x: number, size: number) => Math.floor(x / size + 1e-9);

/** Set current over the LED rating, in steps; a resistor's current is the typical one at the nominal supply. */
function driveSteps(report: KitReport, d: ResolvedDriver, ledMaxAmps: number): number {
  const amps = d.type === 'resistor' ? Math.max(0, report.checks.find((c) => c.id === 'typical-current')!.value) : d.outputAmps;
  return step(Math.min(1, amps / ledMaxAmps), DRIVE_STEP);
}

/** A pair that passed, before its report is written out. */
type Entry = Omit<Candidate, 'report' | 'reason'> & { spec: ResolvedKitSpec; driveSteps: number; useSteps: number };

function entryOf(supplyId: string, driverId: string, spec: ResolvedKitSpec): Entry | null {
  return entryFrom(supplyId, driverId, spec, evaluateKit(spec, { messages: false }));
}

function entryFrom(supplyId: string, driverId: string, spec: ResolvedKitSpec, report: KitReport): Entry | null {
  if (report.verdict === 'fail') return null;
  let margin = Infinity;
  for (const c of report.checks) margin = Math.min(margin, checkMargin(c));
  const driveSteps_ = driveSteps(report, spec.driver, spec.string.led.maxAmps);
  const useSteps = step(Math.min(1, report.figures.supplyAmps / spec.supply.maxAmps), SUPPLY_STEP);
  return {
    supplyId,
    driverId,
    verdict: report.verdict,
    drive: driveSteps_ * DRIVE_STEP,
    supplyUse: useSteps * SUPPLY_STEP,
    driveSteps: driveSteps_,
    useSteps,
    margin,
    spec,
  };
}

type Ranked = Pick<Candidate, 'supplyId' | 'driverId' | 'verdict' | 'drive' | 'supplyUse' | 'margin'>;

/** ok before caution, then drive nearest the rating, then the supply used best, then margin; ids settle ties. */
export function compareCandidates(a: Ranked, b: Ranked): number {
  return (
    VERDICT_RANK[a.verdict] - VERDICT_RANK[b.verdict] ||
    step(b.drive, DRIVE_STEP) - step(a.drive, DRIVE_STEP) ||
    step(b.supplyUse, SUPPLY_STEP) - step(a.supplyUse, SUPPLY_STEP) ||
    b.margin - a.margin ||
    (a.supplyId < b.supplyId ? -1 : a.supplyId > b.supplyId ? 1 : 0) ||
    (a.driverId < b.driverId ? -1 : a.driverId > b.driverId ? 1 : 0)
  );
}

/** Keeps `top` sorted and at most `limit` long (an entry after the last of a full list goes in and out). */
function offer(top: Entry[], e: Entry, limit: number): void {
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

function reasonOf(e: Entry, report: KitReport, ledMaxAmps: number): string {
  const amps = e.spec.driver.type === 'resistor' ? report.figures.ledAmpsAvg : e.spec.driver.outputAmps;
  const drive = `drives the LEDs at ${formatAmps(amps)}, ${formatPercent(Math.min(1, amps / ledMaxAmps), -1)} of their rating`;
  const use = `uses ${formatPercent(report.figures.supplyAmps / e.spec.supply.maxAmps, -1)} of the supply's current`;
  const cautions = report.checks.filter((c) => c.verdict === 'caution').map((c) => c.id);
  return `${drive}; ${use}${cautions.length ? `; caution: ${cautions.join(', ')}` : ''}`;
}

/** The winners get their full report, messages included, and their reason. */
function finish(top: Entry[], p: Prepared, checked: number): RankResult {
  return {
    candidates: top.map(({ spec, driveSteps: _d, useSteps: _u, ...e }) => {
      const report = evaluateKit(spec);
      return { ...e, reason: reasonOf({ ...e, spec, driveSteps: _d, useSteps: _u }, report, p.string.led.maxAmps), report };
    }),
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

/**
 * For one driver: the best drive step any supply could give, and the supply window outside which the pair
 * certainly fails — or null when the driver fails with this string whatever the supply. Each condition is
 * one the full check fails on (with its tolerance), so no passing pair is dropped.
 */
function planFor(d: ResolvedDriver, p: Prepared): { bestSteps: number; lowFrom: number; highTo: number } | null {
  const { string } = p;
  const led = string.led;
  const sv = stringVolts(string);
  const pwm = p.pwmDuty ?? 1;
  if (d.type === 'resistor') return { bestSteps: step(1, DRIVE_STEP), lowFrom: -Infinity, highTo: SELV_DC_LIMIT_VOLTS };
  // Driver alone: LED current (the peak is at least the set current) and worst-case LED power.
  if (isAbove(d.outputAmps, led.maxAmps) || isAbove(led.vfMax * pwm * d.outputAmps, led.maxWatts)) return null;
  const highTo = Math.min(SELV_DC_LIMIT_VOLTS, d.maxInputVolts);
  const bestSteps = step(Math.min(1, d.outputAmps / led.maxAmps), DRIVE_STEP);
  if (d.type === 'linear') return { bestSteps, lowFrom: sv.typ + d.dropoutVolts, highTo };
  if (d.maxOutputVolts !== undefined && isAbove(sv.max, d.maxOutputVolts)) return null;
  if (d.inductorSatAmps !== undefined && isAbove(d.outputAmps, d.inductorSatAmps)) return null;
  // The voltage at the driver is at most the supply's low end: headroom, minimum input and duty for
  // typical LEDs all need the low end to reach these.
  const lowFrom = Math.max(sv.typ + d.headroomVolts, d.minInputVolts, sv.typ / (d.maxDuty * d.efficiency));
  return { bestSteps, lowFrom, highTo };
}

// ---------------------------------------------------------------------------------------------------
// Best first with bounds (branch and bound). Every pair gets a bound: a key no worse than the one the full
// check could give it (verdict no better than `floor`, drive, supply use and margin no higher). Pairs are
// checked in the order of their bounds; once the list is full and its last entry ranks before the next
// bound, nothing left can enter. The bounds only ever say "certainly no better": the full check decides.

/** A pair's best possible key (the ids are its own, exactly). */
type Bound = { floor: number; drive: number; use: number; margin: number; supplyId: string; driverId: string };
type PairBound = Bound & { s: PreparedSupply; plan: DriverPlan };

/** Checks whose value and limit read nothing of the supply: the same verdict and margin for every supply. */
const SUPPLY_FREE: Record<ResolvedDriver['type'], ReadonlySet<string>> = {
  buck: new Set(['driver-max-output', 'led-power', 'led-junction']),
  linear: new Set(['led-current', 'led-power', 'led-junction', 'wire-current-density']),
  resistor: new Set(),
};

type DriverPlan = {
  d: PreparedDriver;
  lowFrom: number;
  highTo: number;
  /** Its supplies: indexes into the supplies sorted by low end, from `first` while the low end stays in. */
  first: number;
  bound: Bound;
  probed: boolean;
  /** Buck: its worst-case input power; linear: its average current (both read from the probe's report). */
  inputWatts?: number;
  supplyAmps?: number;
};

/** Slack for quantities computed beside the check (the same formulas, but a bound must never be short). */
const up = (x: number) => x + Math.abs(x) * 1e-12;
const down = (x: number) => x - Math.abs(x) * 1e-12;

/** a before b by the ranking's keys; the ids count only when both are given (a driver's bound has none). */
function boundCmp(a: Bound, b: Bound): number {
  const c = a.floor - b.floor || b.drive - a.drive || b.use - a.use;
  if (c) return c;
  if (a.margin !== b.margin) return a.margin > b.margin ? -1 : 1;
  if (!a.supplyId || !b.supplyId) return 0;
  return a.supplyId < b.supplyId ? -1 : a.supplyId > b.supplyId ? 1 : a.driverId < b.driverId ? -1 : a.driverId > b.driverId ? 1 : 0;
}

const keyOf = (e: Entry): Bound => ({
  floor: VERDICT_RANK[e.verdict],
  drive: e.driveSteps,
  use: e.useSteps,
  margin: e.margin,
  supplyId: e.supplyId,
  driverId: e.driverId,
});

/** A binary heap, smallest first by `cmp`. */
class Heap<T> {
  private a: T[] = [];
  constructor(private cmp: (x: T, y: T) => number) {}
  get size() {
    return this.a.length;
  }
  peek(): T | undefined {
    return this.a[0];
  }
  push(x: T): void {
    const a = this.a;
    let i = a.push(x) - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (this.cmp(a[i], a[parent]) >= 0) break;
      [a[i], a[parent]] = [a[parent], a[i]];
      i = parent;
    }
  }
  pop(): T | undefined {
    const a = this.a;
    const top = a[0];
    const last = a.pop();
    if (a.length && last !== undefined) {
      a[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < a.length && this.cmp(a[l], a[m]) < 0) m = l;
        if (r < a.length && this.cmp(a[r], a[m]) < 0) m = r;
        if (m === i) break;
        [a[i], a[m]] = [a[m], a[i]];
        i = m;
      }
    }
    return top;
  }
}

/** The pruned search; same answers as rankCandidatesNaive. */
export function rankCandidates(q: RankQuery): RankResult {
  const p = prepare(q);
  const supplies = [...p.supplies].sort((a, b) => a.low - b.low);
  const lows = Float64Array.from(supplies, (s) => s.low);
  const sv = stringVolts(p.string);
  const led = p.string.led;
  const pwm = p.pwmDuty ?? 1;
  const wireOhms = p.wiring ? loopOhms(p.wiring.lengthMeters, p.wiring.awg) : 0;
  const maxNominal = supplies.reduce((m, s) => Math.max(m, s.spec.volts), -Infinity);

  const top: Entry[] = [];
  let checked = 0;
  const full = () => top.length === p.limit;
  const last = () => keyOf(top[p.limit - 1]);
  const evaluate = (s: PreparedSupply, d: PreparedDriver): KitReport => {
    checked++;
    const spec = specOf(p, s.spec, d.spec);
    const report = evaluateKit(spec, { messages: false });
    const e = entryFrom(s.id, d.id, spec, report);
    if (e) offer(top, e, p.limit);
    return report;
  };

  const drivers = new Heap<DriverPlan>((a, b) => boundCmp(a.bound, b.bound));
  for (const d of p.drivers) {
    const plan = planFor(d.spec, p);
    if (!plan) continue;
    // First supply whose low end is not certainly short (binary search on the sorted low ends).
    let lo = 0;
    let hi = lows.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (isBelow(lows[mid], plan.lowFrom)) lo = mid + 1;
      else hi = mid;
    }
    // A resistor's drive depends on the supply: at best what the shelf's highest nominal voltage gives.
    const drive = d.spec.type === 'resistor' ? resistorDriveBound(maxNominal, sv.typ, d.spec.ohms, led.maxAmps) : plan.bestSteps;
    const bound = { floor: 0, drive, use: step(1, SUPPLY_STEP), margin: Infinity, supplyId: '', driverId: '' };
    drivers.push({ d, lowFrom: plan.lowFrom, highTo: plan.highTo, first: lo, bound, probed: false });
  }

  const pairs = new Heap<PairBound>(boundCmp);
  const inWindow = (plan: DriverPlan, si: number) => !isAbove(supplies[si].low, plan.highTo);
  for (;;) {
    const nd = drivers.peek();
    const np = pairs.peek();
    if (nd && (!np || boundCmp(np, nd.bound) >= 0)) {
      drivers.pop();
      if (full() && boundCmp(last(), nd.bound) < 0) {
        // Neither this driver nor any after it can place a pair in the list.
        while (drivers.pop());
        continue;
      }
      let si = nd.first;
      while (si < supplies.length && inWindow(nd, si) && isAbove(supplies[si].high, nd.highTo)) si++;
      if (si >= supplies.length || !inWindow(nd, si)) continue; // no supply on the shelf fits it
      if (!nd.probed) {
        // Probe: check the driver with its first supply (an ordinary pair, offered like the others) and
        // read what holds for every supply from the checks that do not depend on it.
        const report = evaluate(supplies[si], nd.d);
        const free = SUPPLY_FREE[nd.d.spec.type];
        let floor = 0;
        let margin = Infinity;
        for (const c of report.checks)
          if (free.has(c.id)) {
            floor = Math.max(floor, VERDICT_RANK[c.verdict]);
            margin = Math.min(margin, checkMargin(c));
          }
        if (floor === VERDICT_RANK.fail) continue;
        // A buck's LED current is at least its set current (the peak adds half the ripple).
        if (nd.d.spec.type === 'buck') margin = Math.min(margin, up(checkMargin({ id: 'led-current', value: nd.d.spec.outputAmps, limit: led.maxAmps })));
        nd.bound = { ...nd.bound, floor, margin };
        nd.probed = true;
        if (nd.d.spec.type === 'buck') nd.inputWatts = report.figures.inputWatts;
        if (nd.d.spec.type === 'linear') nd.supplyAmps = report.figures.supplyAmps;
        nd.first = si + 1;
        drivers.push(nd);
        continue;
      }
      for (; si < supplies.length && inWindow(nd, si); si++) {
        const s = supplies[si];
        if (isAbove(s.high, nd.highTo)) continue;
        const b = pairBound(nd, s, sv, pwm, wireOhms, led.maxAmps);
        if (b && !(full() && boundCmp(last(), b) < 0)) pairs.push(b);
      }
      continue;
    }
    if (!np) break;
    pairs.pop();
    // Everything left (pairs and drivers) is bounded by no better than this pair.
    if (full() && boundCmp(last(), np) < 0) break;
    evaluate(np.s, np.plan.d);
  }
  return finish(top, p, checked);
}

function resistorDriveBound(nominal: number, sTyp: number, ohms: number, ledAmps: number): number {
  return step(Math.min(1, up(Math.max(0, (nominal - sTyp) / ohms)) / ledAmps), DRIVE_STEP);
}

/**
 * One pair's bound, or null when it certainly fails. The supply current is computed as the check computes
 * it (rule 5: a buck's P_in drawn at the supply's low end through the wire, a linear's average current, a
 * resistor's worst-corner current × D); its verdict and margin bound the pair's.
 */
function pairBound(
  plan: DriverPlan,
  s: PreparedSupply,
  sv: { min: number; typ: number },
  pwm: number,
  wireOhms: number,
  ledAmps: number,
): PairBound | null {
  const d = plan.d.spec;
  let drive = plan.bound.drive;
  let margin = plan.bound.margin;
  let amps: number | undefined;
  if (d.type === 'buck') {
    if (plan.inputWatts !== undefined && Number.isFinite(plan.inputWatts)) amps = constantPowerDraw(s.low, wireOhms, plan.inputWatts).amps;
  } else if (d.type === 'linear') amps = plan.supplyAmps;
  else {
    // Rule 9: no typical current, or a worst-corner current over the LEDs' rating, fails.
    if (!isAbove(s.spec.volts, sv.typ)) return null;
    const iMax = resistorAmps(s.high, sv.min, d.ohms);
    if (isAbove(down(iMax), ledAmps)) return null;
    margin = Math.min(margin, up(checkMargin({ id: 'led-current', value: iMax, limit: ledAmps })));
    drive = Math.min(drive, resistorDriveBound(s.spec.volts, sv.typ, d.ohms, ledAmps));
    amps = pwm * iMax;
  }
  let floor = plan.bound.floor;
  let use = step(1, SUPPLY_STEP);
  if (amps !== undefined && Number.isFinite(amps)) {
    const max = s.spec.maxAmps;
    const v = verdictAtMost(down(amps), max, SUPPLY_CURRENT_CAUTION_FRACTION * max);
    if (v === 'fail') return null;
    floor = Math.max(floor, VERDICT_RANK[v]);
    use = step(Math.min(1, up(amps) / max), SUPPLY_STEP);
    margin = Math.min(margin, up(checkMargin({ id: 'supply-current', value: down(amps), limit: max })));
  }
  if (Number.isNaN(margin)) margin = Infinity;
  return { floor, drive, use, margin, supplyId: s.id, driverId: plan.d.id, s, plan };
}
