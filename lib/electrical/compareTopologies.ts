// Buck vs linear vs series resistor for the same string on the same supply, each run through the
// full check with a generic driver of that kind, so the comparison uses the same rules as a real build.
import type { Verdict } from './checks';
import { evaluateKit } from './checkKit';
import type { KitReport } from './report';
import { HEAT_SINK_WATTS, LED_POWER_CAUTION_FRACTION } from './thresholds';
import { supplyWindow } from './circuit';
import { type DriverSpec,
  MAX_VOLTS, type StringSpec, type SupplySpec, kitSpecSchema, stringSpecSchema, supplySpecSchema } from './schema';
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
  report: KitReport | null;
};

/** When no current is given: 70 % of the most the LED allows by current or by power. */
export function defaultDriveAmps(led: { vfTyp: number; maxAmps: number; maxWatts: number }): number {
  return LED_POWER_CAUTION_FRACTION * Math.min(led.maxAmps, led.maxWatts / led.vfTyp);
}

export function compareTopologies(
  stringSpec: StringSpec,
  supplySpec: SupplySpec,
  options: { amps?: number; pwmDuty?: number } = {},
): TopologyRow[] {
  const string = stringSpecSchema.parse(stringSpec);
  const supply = supplySpecSchema.parse(supplySpec);
  const amps = options.amps ?? defaultDriveAmps(string.led);
  const high = supplyWindow(supply).high;

  const run = (driver: DriverSpec) =>
    evaluateKit(kitSpecSchema.parse({ supply, driver, string, ...(options.pwmDuty !== undefined ? { pwmDuty: options.pwmDuty } : {}) }));

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
    row('linear', linear, `a generic linear driver with ${GENERIC_LINEAR_DROPOUT_VOLTS.toFixed(1)} V dropout`),
  ];

  const design = designSeriesResistor({ string, supply, amps });
  if (!design.feasible) {
    rows.push({
      type: 'resistor',
      verdict: 'fail',
      efficiency: 0,
      heatWatts: 0,
      inputWatts: 0,
      supplyAmps: 0,
      parts: PART_COUNT.resistor,
      partsNote: PARTS_NOTE.resistor,
      driverNote: design.reason,
      report: null,
    });
  } else {
    const watts = design.wattageToBuy ?? 50;
    const report = run({ type: 'resistor', ohms: design.ohms, watts });
    rows.push(row('resistor', report, `a resistor of ${design.ohms} Ω (${design.series}), rated ${watts} W`));
  }
  return rows;
}
