import { z } from 'zod';

// The input of the compatibility check. SI units, plain numbers. The same schema feeds checkKit, the
// route handler and the page's form, so a bad value is named by the same dotted path everywhere.
//
// Every object is strict: a key the check does not know (a misspelt `efficency`, an AC supply's `type`)
// is refused at its own path rather than dropped, because a dropped field silently falls back to a
// default and the verdict then describes a different build. Every number has physical bounds, so no
// accepted input can overflow the maths (README.md in this folder lists them).

/** A failing schema for any key not declared: the issue's path is the unknown key itself. */
const unknownKey = z.unknown().refine(() => false, { error: 'Unknown field: check its spelling, or leave it out' });

/** A strict object whose unknown keys are each reported at their own path (zod's own strict mode names only the parent). */
function strictObject<T extends z.core.$ZodLooseShape>(shape: T): z.ZodObject<T, z.core.$strict> {
  // Typed as zod's strict object (no index signature), so TypeScript still flags a misspelt key in code.
  return z.object(shape).catchall(unknownKey) as unknown as z.ZodObject<T, z.core.$strict>;
}

type Bounds = { gt?: number; gte?: number; lte: number };

/** A finite number inside physical bounds; the messages say what the field is and which way it is out. */
function bounded(what: string, b: Bounds, unit = '') {
  const u = unit ? ` ${unit}` : '';
  let s = z.number({ error: `${what} must be a number` });
  if (b.gt !== undefined) s = s.gt(b.gt, { error: `${what} must be greater than ${b.gt}${u}` });
  if (b.gte !== undefined) s = s.gte(b.gte, { error: `${what} must be at least ${b.gte}${u}` });
  return s.lte(b.lte, { error: `${what} cannot be more than ${b.lte}${u}` });
}
const volts = (what: string) => bounded(what, { gt: 0, lte: MAX_VOLTS }, 'V');
const amps = (what: string) => bounded(what, { gt: 0, lte: MAX_AMPS }, 'A');
const forwardVolts = (what: string) => bounded(what, { gt: 0, lte: MAX_VF }, 'V');
const watts = (what: string) => bounded(what, { gt: 0, lte: MAX_WATTS }, 'W');
const fraction = (what: string) => bounded(what, { gt: 0, lte: 1 });
const thermalOhms = (what: string) => bounded(what, { gt: 0, lte: MAX_THERMAL_OHMS }, '°C/W');
const junctionC = (what: string) => bounded(what, { gte: MIN_JUNCTION_C, lte: MAX_JUNCTION_C }, '°C');
const wholeNumber = (what: string, min: number, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .int({ error: `${what} must be a whole number` })
    .min(min, { error: `${what} must be at least ${min}` })
    .max(max, { error: `${what} cannot be more than ${max}` });

// Physical caps (outside them the input is a typing slip, and inside them every figure stays finite).
export const MAX_VOLTS = 1000;
export const MAX_AMPS = 100;
export const MAX_WATTS = 1000;
export const MAX_TOLERANCE_PCT = 50;
export const MIN_HENRIES = 1e-7;
export const MAX_HENRIES = 1;
export const MIN_SWITCHING_HZ = 1e3;
export const MAX_SWITCHING_HZ = 1e7;
export const MIN_OHMS = 0.01;
export const MAX_OHMS = 1e7;
export const MAX_VF = 60;
export const MAX_LED_COUNT = 200;
export const MAX_WIRE_METERS = 1000;
export const MAX_THERMAL_OHMS = 200;
export const MIN_JUNCTION_C = 50;
export const MAX_JUNCTION_C = 200;
export const MAX_HEAT_SINKS = 50;
export const MIN_AMBIENT_C = -20;
export const MAX_AMBIENT_C = 60;

// Defaults. The electrical ones are the contract's; the thermal ones are from memory (typical 1–3 W LEDs
// on star boards, a TO-220-class regulator), see README.md.
export const DEFAULT_TOLERANCE_PCT = 5;
export const DEFAULT_HEADROOM_VOLTS = 1.5;
export const DEFAULT_MAX_DUTY = 0.95;
export const DEFAULT_EFFICIENCY = 0.9;
export const DEFAULT_LED_THERMAL_OHMS_JS = 8;
export const DEFAULT_MAX_JUNCTION_C = 125;
export const DEFAULT_JUNCTION_TO_CASE_C_PER_W = 5;
export const DEFAULT_AMBIENT_C = 25;

export const supplySpecSchema = strictObject({
  volts: volts('Supply voltage'),
  tolerancePct: bounded('Supply tolerance', { gte: 0, lte: MAX_TOLERANCE_PCT }, '%').default(DEFAULT_TOLERANCE_PCT),
  maxAmps: amps('Supply current rating'),
  /** Only DC supplies are checked; an AC source is refused by name. */
  kind: z.literal('dc', { error: 'Only DC supplies can be checked here (kind must be "dc")' }).optional(),
});

const buckDriverSchema = strictObject({
  type: z.literal('buck'),
  minInputVolts: volts('Driver minimum input'),
  maxInputVolts: volts('Driver maximum input'),
  outputAmps: amps('Driver output current'),
  headroomVolts: volts('Driver headroom').default(DEFAULT_HEADROOM_VOLTS),
  maxDuty: fraction('Maximum duty cycle').default(DEFAULT_MAX_DUTY),
  efficiency: fraction('Efficiency').default(DEFAULT_EFFICIENCY),
  maxOutputVolts: volts('Driver maximum output').optional(),
  inductorHenries: bounded('Inductance', { gte: MIN_HENRIES, lte: MAX_HENRIES }, 'H (0.1 µH to 1 H, given in henries)').optional(),
  switchingHz: bounded('Switching frequency', { gte: MIN_SWITCHING_HZ, lte: MAX_SWITCHING_HZ }, 'Hz (1 kHz to 10 MHz, given in hertz)').optional(),
  inductorSatAmps: amps('Inductor saturation current').optional(),
}).refine((d) => d.minInputVolts <= d.maxInputVolts, {
  error: 'The minimum input cannot be above the maximum input',
  path: ['minInputVolts'],
}).describe('The minimum input cannot be above the maximum input.');

const linearDriverSchema = strictObject({
  type: z.literal('linear'),
  maxInputVolts: volts('Driver maximum input'),
  outputAmps: amps('Driver output current'),
  dropoutVolts: volts('Dropout voltage'),
  maxWatts: watts('Driver power rating').optional(),
  /** Heat sink under the regulator, sink → air. */
  sinkCPerW: thermalOhms('Regulator heat sink').optional(),
  junctionToCaseCPerW: thermalOhms('Regulator junction-to-case resistance').default(DEFAULT_JUNCTION_TO_CASE_C_PER_W),
  maxJunctionC: junctionC('Regulator maximum junction temperature').default(DEFAULT_MAX_JUNCTION_C),
});

const resistorDriverSchema = strictObject({
  type: z.literal('resistor'),
  ohms: bounded('Resistance', { gte: MIN_OHMS, lte: MAX_OHMS }, 'Ω'),
  watts: watts('Resistor power rating'),
});

export const driverSpecSchema = z.discriminatedUnion('type', [buckDriverSchema, linearDriverSchema, resistorDriverSchema], {
  error: 'Driver type must be "buck", "linear" or "resistor"',
});

export const ledSpecSchema = strictObject({
  vfMin: forwardVolts('Minimum forward voltage'),
  vfTyp: forwardVolts('Typical forward voltage'),
  vfMax: forwardVolts('Maximum forward voltage'),
  maxAmps: amps('LED current rating'),
  maxWatts: watts('LED power rating'),
  /** Junction → solder point, °C/W. */
  thermalOhmsJs: thermalOhms('LED junction-to-solder-point resistance').default(DEFAULT_LED_THERMAL_OHMS_JS),
  maxJunctionC: junctionC('LED maximum junction temperature').default(DEFAULT_MAX_JUNCTION_C),
})
  // Equal values are allowed (a datasheet may give one figure); reversed ones are a typing slip.
  .superRefine((led, ctx) => {
    if (led.vfMin > led.vfTyp)
      ctx.addIssue({ code: 'custom', path: ['vfMin'], message: 'Minimum forward voltage is above the typical one' });
    if (led.vfTyp > led.vfMax)
      ctx.addIssue({ code: 'custom', path: ['vfMax'], message: 'Maximum forward voltage is below the typical one' });
  })
  .describe('vfMin ≤ vfTyp ≤ vfMax: a minimum forward voltage is above the typical one, or a maximum forward voltage is below the typical one, is refused.');

export const stringSpecSchema = strictObject({
  count: wholeNumber('LED count', 1, MAX_LED_COUNT),
  led: ledSpecSchema,
});

/** American Wire Gauge: 0000 (4/0) is written −3, 000 is −2, 00 is −1, 0 is 0. */
export const MIN_AWG = -3;
export const MAX_AWG = 40;

export const wiringSpecSchema = strictObject({
  lengthMeters: bounded('Wire length', { gt: 0, lte: MAX_WIRE_METERS }, 'm'),
  awg: z
    .number({ error: 'Wire gauge must be a number' })
    .int({ error: 'Wire gauge must be a whole number (4/0 is −3)' })
    .min(MIN_AWG, { error: 'Wire gauge must be 4/0 (−3) or thinner' })
    .max(MAX_AWG, { error: 'Wire gauge must be 40 or thicker' }),
});

/** The kit's own heat sinks for the LEDs: `count` sinks sharing the LEDs evenly, each `cPerW` sink → air. */
export const heatSinkSpecSchema = strictObject({
  count: wholeNumber('Heat sink count', 1, MAX_HEAT_SINKS),
  cPerW: thermalOhms('Heat sink thermal resistance'),
});

export const pwmDutySchema = fraction('PWM duty');
export const ambientCSchema = bounded('Ambient temperature', { gte: MIN_AMBIENT_C, lte: MAX_AMBIENT_C }, '°C');

export const kitSpecSchema = strictObject({
  supply: supplySpecSchema,
  driver: driverSpecSchema,
  string: stringSpecSchema,
  pwmDuty: pwmDutySchema.optional(),
  wiring: wiringSpecSchema.optional(),
  heatSink: heatSinkSpecSchema.optional(),
  ambientC: ambientCSchema.default(DEFAULT_AMBIENT_C),
});

/** What callers send (defaults may be left out) — the contract's KitSpec. */
export type KitSpec = z.input<typeof kitSpecSchema>;
/** After parsing: every default filled in. */
export type ResolvedKitSpec = z.output<typeof kitSpecSchema>;

export type SupplySpec = z.input<typeof supplySpecSchema>;
export type DriverSpec = z.input<typeof driverSpecSchema>;
export type StringSpec = z.input<typeof stringSpecSchema>;
export type LedSpec = z.input<typeof ledSpecSchema>;
export type WiringSpec = z.input<typeof wiringSpecSchema>;
export type HeatSinkSpec = z.input<typeof heatSinkSpecSchema>;

export type ResolvedSupply = z.output<typeof supplySpecSchema>;
export type ResolvedDriver = z.output<typeof driverSpecSchema>;
export type ResolvedString = z.output<typeof stringSpecSchema>;
export type ResolvedWiring = z.output<typeof wiringSpecSchema>;
export type ResolvedHeatSink = z.output<typeof heatSinkSpecSchema>;
export type ResolvedBuck = Extract<ResolvedDriver, { type: 'buck' }>;
export type ResolvedLinear = Extract<ResolvedDriver, { type: 'linear' }>;
export type ResolvedResistor = Extract<ResolvedDriver, { type: 'resistor' }>;
