// The compatibility check and its helpers. Pure maths: no I/O, no framework, only zod.
export {
  kitSpecSchema,
  supplySpecSchema,
  driverSpecSchema,
  stringSpecSchema,
  ledSpecSchema,
  wiringSpecSchema,
  heatSinkSpecSchema,
  pwmDutySchema,
  ambientCSchema,
  DEFAULT_TOLERANCE_PCT,
  DEFAULT_HEADROOM_VOLTS,
  DEFAULT_MAX_DUTY,
  DEFAULT_EFFICIENCY,
  DEFAULT_LED_THERMAL_OHMS_JS,
  DEFAULT_MAX_JUNCTION_C,
  DEFAULT_JUNCTION_TO_CASE_C_PER_W,
  DEFAULT_AMBIENT_C,
  MAX_VOLTS,
  MAX_AMPS,
  MAX_WATTS,
  MAX_TOLERANCE_PCT,
  MIN_HENRIES,
  MAX_HENRIES,
  MIN_SWITCHING_HZ,
  MAX_SWITCHING_HZ,
  MIN_OHMS,
  MAX_OHMS,
  MAX_VF,
  MAX_LED_COUNT,
  MAX_WIRE_METERS,
  MAX_THERMAL_OHMS,
  MIN_JUNCTION_C,
  MAX_JUNCTION_C,
  MAX_HEAT_SINKS,
  MIN_AMBIENT_C,
  MAX_AMBIENT_C,
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
  HeatSinkSpec,
} from './schema';
export { ledThermal, regulatorJunctionC, LED_BOARD_C_PER_W, BARE_STAR_C_PER_W, REGULATOR_INTERFACE_C_PER_W, REGULATOR_FREE_AIR_C_PER_W, JUNCTION_CAUTION_MARGIN_C } from './thermal';
export { checkKit, evaluateKit } from './checkKit';
export type { KitReport, KitFigures } from './checkKit';
export { CHECK_DIRECTION, CHECK_TITLE, checkMargin, worst } from './checks';
export type { Check, CheckId, Verdict } from './checks';
export { safetyCautions, generalCautions } from './cautions';
export type { Caution } from './cautions';
export { supplyWindow, stringVolts, buckDuty, buckRippleAmps, worstBuckRippleAmps, resistorAmps, constantPowerDraw } from './circuit';
export { awgDiameterMm, awgAreaMm2, awgOhmsPerMeter, loopOhms } from './awg';
export { awgName } from './wire';
export { E12, E24, nearestAtOrAbove, nearestAtOrBelow, wattageAtOrAbove } from './eSeries';
export { designSeriesResistor } from './seriesResistor';
export type { SeriesResistorDesign } from './seriesResistor';
export { compareTopologies, defaultDriveAmps } from './compareTopologies';
export type { TopologyRow } from './compareTopologies';
export { rankCandidates, rankCandidatesNaive, compareCandidates } from './rank';
export type { RankQuery, RankResult, Candidate, ShelfSupply, ShelfDriver } from './rank';
export { formatVolts, formatAmps, formatWatts, formatPercent, formatSi, formatQuantity } from './format';
