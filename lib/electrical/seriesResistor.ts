// Series-resistor design for an LED string on a supply: the resistor that sets the wanted current,
// rounded up to a preferred value, and what it dissipates across the supply and LED spread.
import { RESISTOR_DERATING_FRACTION } from './thresholds';
import { resistorAmps, stringVolts, supplyWindow } from './circuit';
import { SERIES, type ESeriesName, nearestAtOrAbove, wattageAtOrAbove } from './eSeries';
import { MAX_OHMS, type StringSpec, type SupplySpec, stringSpecSchema, supplySpecSchema } from './schema';

export type SeriesResistorDesign =
  | { feasible: false; reason: string }
  | {
      feasible: true;
      /** R = (V − N × Vf,typ) / I at the nominal supply. */
      ohmsExact: number;
      /** The next preferred value up, so the current ends at or under the target. */
      ohms: number;
      series: ESeriesName;
      ampsTyp: number;
      /** Supply high, LEDs at vfMin. */
      ampsMax: number;
      /** Supply low, LEDs at vfMax. */
      ampsMin: number;
      wattsTyp: number;
      wattsMax: number;
      /** Smallest stock rating at least twice the worst dissipation; null when none is big enough. */
      wattageToBuy: number | null;
    };

export function designSeriesResistor(input: {
  string: StringSpec;
  supply: SupplySpec;
  amps: number;
  series?: ESeriesName;
}): SeriesResistorDesign {
  const string = stringSpecSchema.parse(input.string);
  const supply = supplySpecSchema.parse(input.supply);
  if (!(input.amps > 0) || !Number.isFinite(input.amps)) throw new RangeError('amps must be a positive number');
  const series = input.series ?? 'E24';
  const sv = stringVolts(string);
  const w = supplyWindow(supply);
  const spare = w.nominal - sv.typ;
  if (!(spare > 0))
    return { feasible: false, reason: 'The supply is not above the string’s typical voltage, so no resistor can work.' };
  const ohmsExact = spare / input.amps;
  if (!(ohmsExact <= MAX_OHMS))
    return { feasible: false, reason: 'The resistor this current needs is above 10 MΩ: the current is too small to set with a resistor.' };
  const ohms = nearestAtOrAbove(ohmsExact, SERIES[series]);
  const ampsTyp = resistorAmps(w.nominal, sv.typ, ohms);
  const ampsMax = resistorAmps(w.high, sv.min, ohms);
  const ampsMin = resistorAmps(w.low, sv.max, ohms);
  const wattsMax = ampsMax * ampsMax * ohms;
  return {
    feasible: true,
    ohmsExact,
    ohms,
    series,
    ampsTyp,
    ampsMax,
    ampsMin,
    wattsTyp: ampsTyp * ampsTyp * ohms,
    wattsMax,
    wattageToBuy: wattageAtOrAbove(wattsMax / RESISTOR_DERATING_FRACTION),
  };
}
