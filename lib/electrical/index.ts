// The compatibility check and its helpers. Pure maths: no I/O, no framework, only zod.
export {
  kitSpecSchema,
  supplySpecSchema,
  driverSpecSchema,
  stringSpecSchema,
  ledSpecSchema,
  wiringSpecSchema,
  DEFAULT_TOLERANCE_PCT,
  DEFAULT_HEADROOM_VOLTS,
  DEFAULT_MAX_DUTY,
  DEFAULT_EFFICIENCY,
  MIN_AWG,
  MAX_AWG,
} from './schema';
export type {
  KitSpec,
  ResolvedKitSpec,
  SupplySpec,
  DriverSpec,
  StringSpec,
  LedSpec,
  WiringSpec,
} from './schema';
export { checkKit, evaluateKit } from './checkKit';
export type { KitReport, KitFigures } from './checkKit';
export { CHECK_DIRECTION, CHECK_TITLE, checkMargin, worst } from './checks';
export type { Check, CheckId, Verdict } from './checks';
export { safetyCautions, generalCautions } from './cautions';
export type { Caution } from './cautions';
export { supplyWindow, stringVolts, buckDuty, buckRippleAmps, resistorAmps } from './circuit';
export { awgDiameterMm, awgOhmsPerMeter, loopOhms } from './awg';
export { awgName } from './wire';
export { E12, E24, nearestAtOrAbove, nearestAtOrBelow, wattageAtOrAbove } from './eSeries';
export { designSeriesResistor } from './seriesResistor';
export type { SeriesResistorDesign } from './seriesResistor';
export { compareTopologies, defaultDriveAmps } from './compareTopologies';
export type { TopologyRow } from './compareTopologies';
export { rankCandidates, rankCandidatesNaive, compareCandidates } from './rank';
export type { RankQuery, RankResult, Candidate, ShelfSupply, ShelfDriver } from './rank';
export { formatVolts, formatAmps, formatWatts, formatPercent, formatSi, formatQuantity } from './format';
