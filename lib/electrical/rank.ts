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
// from the checks that only get worse at the window's ends), and drivers are visited best possible drive
// step first — once the list is full of ok pairs from a better step than the next driver can reach, the
// rest cannot enter. A test and bench/suggest.ts compare the answers with the naive loop's.
import { VERDICT_RANK, checkMargin, isAbove, isBelow } from './checks';
import { evaluateKit } from './checkKit';
import type { KitReport } from './report';
import { stringVolts, supplyWindow } from './circuit';
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
import { SELV_DC_LIMIT_VOLTS } from './thresholds';

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
  const report = evaluateKit(spec, { messages: false });
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

/** The pruned search; same answers as rankCandidatesNaive. */
export function rankCandidates(q: RankQuery): RankResult {
  const p = prepare(q);
  const supplies = [...p.supplies].sort((a, b) => a.low - b.low);
  const lows = Float64Array.from(supplies, (s) => s.low);
  const plans = p.drivers
    .map((d) => ({ d, plan: planFor(d.spec, p) }))
    .filter((x): x is { d: PreparedDriver; plan: NonNullable<ReturnType<typeof planFor>> } => x.plan !== null)
    .sort((a, b) => b.plan.bestSteps - a.plan.bestSteps);

  const top: Entry[] = [];
  let checked = 0;
  for (const { d, plan } of plans) {
    // Full of ok pairs that all drive better than this driver can: nothing later can enter.
    const last = top[p.limit - 1];
    if (top.length === p.limit && last.verdict === 'ok' && last.driveSteps > plan.bestSteps) break;
    // First supply whose low end is not certainly short (binary search on the sorted low ends).
    let lo = 0;
    let hi = lows.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (isBelow(lows[mid], plan.lowFrom)) lo = mid + 1;
      else hi = mid;
    }
    // A supply's high end is at least its low end, so the scan stops once the low end is over highTo.
    for (let si = lo; si < supplies.length && !isAbove(supplies[si].low, plan.highTo); si++) {
      const s = supplies[si];
      if (isAbove(s.high, plan.highTo)) continue;
      checked++;
      const e = entryOf(s.id, d.id, specOf(p, s.spec, d.spec));
      if (e) offer(top, e, p.limit);
    }
  }
  return finish(top, p, checked);
}
