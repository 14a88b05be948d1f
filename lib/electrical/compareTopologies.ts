// Buck vs linear vs series resistor for the same string on the same supply, each run through the
// full check (evaluateKit) with a generic driver of that kind, so the comparison uses the same rules as
// a real build. Each row says in a few words why it stands where it does.
import { z } from 'zod';
import { VERDICT_RANK, type Verdict } from './checks';
import { evaluateKit } from './checkKit';
import { formatPercent, formatWatts } from './format';
import type { KitReport } from './report';
import { HEAT_SINK_WATTS, LED_POWER_CAUTION_FRACTION } from './thresholds';
import { supplyWindow } from './circuit';
import {
  type DriverSpec,
  type HeatSinkSpec,
  type StringSpec,
  type SupplySpec,
  type WiringSpec,
  MAX_AMPS,
  MAX_VOLTS,
  MIN_OHMS,
  ambientCSchema,
  heatSinkSpecSchema,
  kitSpecSchema,
  pwmDutySchema,
  stringSpecSchema,
  supplySpecSchema,
  wiringSpecSchema,
} from './schema';
import { designSeriesResistor } from './seriesResistor';

/** A simple linear constant-current stage needs about a volt across it. */
export const GENERIC_LINEAR_DROPOUT_VOLTS = 1.0;

// Parts in the driver stage when built from discrete components.
export const PART_COUNT = { buck: 6, linear: 2, resistor: 1 } as const;
const PARTS_NOTE = {
  buck: 'controller, inductor, diode, two capacitors, current-sense resistor (or one ready-made module)',
  linear: 'regulator and current-set resistor',
  resistor: 'one resistor',
} as const;

export type TopologyRow = {
  type: 'buck' | 'linear' | 'resistor';
  verdict: Verdict;
  efficiency: number;
  /** Worst-case heat in the driver stage, watts. */
  heatWatts: number;
  inputWatts: number;
  supplyAmps: number;
  /** Parts in the driver stage, plus a heat sink when it dissipates more than about 1 W. */
  parts: number;
  partsNote: string;
  /** How the generic driver was chosen. */
  driverNote: string;
  /** 1 for the one a bench would build: passing first, then least heat, then fewest parts. */
  rank: number;
  /** Why it stands where it does, in a few words. */
  reason: string;
  report: KitReport | null;
};

/** The optional inputs of the comparison, validated with the same bounds as the check (paths as named here). */
export const compareOptionsSchema = z.object({
  amps: z
    .number({ error: 'Drive current must be a number' })
    .gt(0, { error: 'Drive current must be greater than 0 A' })
    .lte(MAX_AMPS, { error: `Drive current cannot be more than ${MAX_AMPS} A` })
    .optional(),
  pwmDuty: pwmDutySchema.optional(),
  wiring: wiringSpecSchema.optional(),
  heatSink: heatSinkSpecSchema.optional(),
  ambientC: ambientCSchema.optional(),
});
export type CompareOptions = { amps?: number; pwmDuty?: number; wiring?: WiringSpec; heatSink?: HeatSinkSpec; ambientC?: number };

/** When no current is given: 70 % of the most the LED allows by current or by worst-case power. */
export function defaultDriveAmps(led: { vfMax: number; maxAmps: number; maxWatts: number }): number {
  return LED_POWER_CAUTION_FRACTION * Math.min(led.maxAmps, led.maxWatts / led.vfMax);
}

export function compareTopologies(stringSpec: StringSpec, supplySpec: SupplySpec, options: CompareOptions = {}): TopologyRow[] {
  const string = stringSpecSchema.parse(stringSpec);
  const supply = supplySpecSchema.parse(supplySpec);
  const opts = compareOptionsSchema.parse(options);
  const amps = opts.amps ?? defaultDriveAmps(string.led);
  const high = supplyWindow(supply).high;
  const { amps: _amps, ...extras } = opts;

  const run = (driver: DriverSpec) => evaluateKit(kitSpecSchema.parse({ supply, driver, string, ...extras }));

  const row = (type: TopologyRow['type'], report: KitReport, driverNote: string): TopologyRow => {
    const heat = report.figures.lossWatts;
    return {
      type,
      verdict: report.verdict,
      efficiency: report.figures.efficiency,
      heatWatts: heat,
      inputWatts: report.figures.inputWatts,
      supplyAmps: report.figures.supplyAmps,
      parts: PART_COUNT[type] + (heat > HEAT_SINK_WATTS ? 1 : 0),
      partsNote: PARTS_NOTE[type] + (heat > HEAT_SINK_WATTS ? ', plus a heat sink' : ''),
      driverNote,
      rank: 0,
      reason: '',
      report,
    };
  };

  // The generic drivers accept the whole supply window, capped at the schema's bound (a supply above it
  // fails the low-voltage limit anyway).
  const maxIn = Math.min(high, MAX_VOLTS);
  const buck = run({
    type: 'buck',
    minInputVolts: Math.min(1, maxIn),
    maxInputVolts: maxIn,
    outputAmps: amps,
    headroomVolts: 1.5,
    maxDuty: 0.95,
    efficiency: 0.9,
  });
  const linear = run({ type: 'linear', maxInputVolts: maxIn, outputAmps: amps, dropoutVolts: GENERIC_LINEAR_DROPOUT_VOLTS });

  const rows = [
    row('buck', buck, 'a generic buck driver: 90 % efficient, 1.5 V headroom, 95 % maximum duty'),
    row('linear', linear, `a generic linear driver with ${GENERIC_LINEAR_DROPOUT_VOLTS.toFixed(1)} V dropout, no heat sink`),
  ];

  // The design never answers above 10 MΩ (it refuses an exact value above it, and 10 MΩ is in the series);
  // a tiny spare voltage or a large current can still ask for less than the check accepts.
  const design = designSeriesResistor({ string, supply, amps });
  if (!design.feasible || !(design.ohms >= MIN_OHMS)) {
    rows.push({
      type: 'resistor',
      verdict: 'fail',
      efficiency: 0,
      heatWatts: 0,
      inputWatts: 0,
      supplyAmps: 0,
      parts: PART_COUNT.resistor,
      partsNote: PARTS_NOTE.resistor,
      driverNote: design.feasible ? 'the resistor this current needs is under 0.01 Ω' : design.reason,
      rank: 0,
      reason: '',
      report: null,
    });
  } else {
    const watts = design.wattageToBuy ?? 50;
    const report = run({ type: 'resistor', ohms: design.ohms, watts });
    rows.push(row('resistor', report, `a resistor of ${design.ohms} Ω (${design.series}), rated ${watts} W`));
  }
  return rankRows(rows);
}

/**
 * How a bench chooses between topologies that all light the LEDs: a passing build first; among those,
 * the one that wastes least heat (it needs no heat sink and the supply does less work), then fewer parts.
 */
function rankRows(rows: TopologyRow[]): TopologyRow[] {
  const order = [...rows].sort(
    (a, b) => VERDICT_RANK[a.verdict] - VERDICT_RANK[b.verdict] || a.heatWatts - b.heatWatts || a.parts - b.parts,
  );
  for (const r of rows) {
    r.rank = order.indexOf(r) + 1;
    r.reason = reasonFor(r);
  }
  return rows;
}

function reasonFor(r: TopologyRow): string {
  if (!r.report) return r.driverNote;
  if (r.verdict === 'fail') {
    const failed = r.report.checks.filter((c) => c.verdict === 'fail').map((c) => c.id);
    return `fails: ${failed.join(', ')}`;
  }
  const heat = r.heatWatts > HEAT_SINK_WATTS ? `wastes ${formatWatts(r.heatWatts)} (needs a heat sink)` : `wastes ${formatWatts(r.heatWatts)}`;
  const caution = r.verdict === 'caution' ? ', with cautions' : '';
  return `${formatPercent(r.efficiency)} efficient, ${heat}, ${r.parts} part${r.parts === 1 ? '' : 's'}${caution}`;
}
