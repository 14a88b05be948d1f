import { z } from 'zod';

// The input of the compatibility check. SI units, plain numbers. The same schema feeds checkKit, the
// route handler and the page's form, so a bad value is named by the same dotted path everywhere.

const above0 = (what: string) =>
  z.number({ error: `${what} must be a number` }).positive({ error: `${what} must be greater than 0` });
const atLeast0 = (what: string) =>
  z.number({ error: `${what} must be a number` }).min(0, { error: `${what} cannot be negative` });
const fraction = (what: string) => above0(what).max(1, { error: `${what} cannot be more than 1` });

export const DEFAULT_TOLERANCE_PCT = 5;
export const DEFAULT_HEADROOM_VOLTS = 1.5;
export const DEFAULT_MAX_DUTY = 0.95;
export const DEFAULT_EFFICIENCY = 0.9;

export const supplySpecSchema = z.object({
  volts: above0('Supply voltage'),
  tolerancePct: atLeast0('Supply tolerance')
    .lt(100, { error: 'Supply tolerance must be under 100 %' })
    .default(DEFAULT_TOLERANCE_PCT),
  maxAmps: above0('Supply current rating'),
});

const buckDriverSchema = z
  .object({
    type: z.literal('buck'),
    minInputVolts: atLeast0('Driver minimum input'),
    maxInputVolts: above0('Driver maximum input'),
    outputAmps: above0('Driver output current'),
    headroomVolts: atLeast0('Driver headroom').default(DEFAULT_HEADROOM_VOLTS),
    maxDuty: fraction('Maximum duty cycle').default(DEFAULT_MAX_DUTY),
    efficiency: fraction('Efficiency').default(DEFAULT_EFFICIENCY),
    maxOutputVolts: above0('Driver maximum output').optional(),
    inductorHenries: above0('Inductance').optional(),
    switchingHz: above0('Switching frequency').optional(),
  })
  .refine((d) => d.minInputVolts <= d.maxInputVolts, {
    error: 'The minimum input cannot be above the maximum input',
    path: ['minInputVolts'],
  });

const linearDriverSchema = z.object({
  type: z.literal('linear'),
  maxInputVolts: above0('Driver maximum input'),
  outputAmps: above0('Driver output current'),
  dropoutVolts: atLeast0('Dropout voltage'),
  maxWatts: above0('Driver power rating').optional(),
});

const resistorDriverSchema = z.object({
  type: z.literal('resistor'),
  ohms: above0('Resistance'),
  watts: above0('Resistor power rating'),
});

export const driverSpecSchema = z.discriminatedUnion('type', [
  buckDriverSchema,
  linearDriverSchema,
  resistorDriverSchema,
]);

export const ledSpecSchema = z
  .object({
    vfMin: above0('Minimum forward voltage'),
    vfTyp: above0('Typical forward voltage'),
    vfMax: above0('Maximum forward voltage'),
    maxAmps: above0('LED current rating'),
    maxWatts: above0('LED power rating'),
  })
  // Equal values are allowed (a datasheet may give one figure); reversed ones are a typing slip.
  .superRefine((led, ctx) => {
    if (led.vfMin > led.vfTyp)
      ctx.addIssue({ code: 'custom', path: ['vfMin'], message: 'Minimum forward voltage is above the typical one' });
    if (led.vfTyp > led.vfMax)
      ctx.addIssue({ code: 'custom', path: ['vfMax'], message: 'Maximum forward voltage is below the typical one' });
  });

export const stringSpecSchema = z.object({
  count: z
    .number({ error: 'LED count must be a number' })
    .int({ error: 'LED count must be a whole number' })
    .min(1, { error: 'A string needs at least one LED' }),
  led: ledSpecSchema,
});

/** American Wire Gauge: 0000 (4/0) is written −3, 000 is −2, 00 is −1, 0 is 0. */
export const MIN_AWG = -3;
export const MAX_AWG = 40;

export const wiringSpecSchema = z.object({
  lengthMeters: atLeast0('Wire length'),
  awg: z
    .number({ error: 'Wire gauge must be a number' })
    .int({ error: 'Wire gauge must be a whole number (4/0 is −3)' })
    .min(MIN_AWG, { error: 'Wire gauge must be 4/0 (−3) or thinner' })
    .max(MAX_AWG, { error: 'Wire gauge must be 40 or thicker' }),
});

export const kitSpecSchema = z.object({
  supply: supplySpecSchema,
  driver: driverSpecSchema,
  string: stringSpecSchema,
  pwmDuty: fraction('PWM duty').optional(),
  wiring: wiringSpecSchema.optional(),
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

export type ResolvedSupply = z.output<typeof supplySpecSchema>;
export type ResolvedDriver = z.output<typeof driverSpecSchema>;
export type ResolvedString = z.output<typeof stringSpecSchema>;
export type ResolvedWiring = z.output<typeof wiringSpecSchema>;
export type ResolvedBuck = Extract<ResolvedDriver, { type: 'buck' }>;
export type ResolvedLinear = Extract<ResolvedDriver, { type: 'linear' }>;
export type ResolvedResistor = Extract<ResolvedDriver, { type: 'resistor' }>;
