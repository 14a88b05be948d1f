import { z } from 'zod';
import { ambientCSchema, defaultDriveAmps, heatSinkSpecSchema, stringSpecSchema, supplySpecSchema, wiringSpecSchema } from '@/lib/electrical';

// The body of POST /api/bench-check/compare: one LED string on one supply, and optionally the current
// to drive it at, a PWM duty, the wire run, the LEDs' heat sinks and the room temperature. Strict like the check's own schema: an unknown key is named, not dropped.

/** Lowest drive current the comparison accepts: 0.1 mA. Below it a series resistor from a 1000 V supply
 *  would exceed the check's 10 MΩ cap, and no LED on a bench is driven that faintly. */
export const MIN_COMPARE_AMPS = 1e-4;
export const MAX_COMPARE_AMPS = 100;

export const compareBodySchema = z.strictObject({
  string: stringSpecSchema,
  supply: supplySpecSchema,
  amps: z
    .number({ error: 'Drive current must be a number (amperes)' })
    .min(MIN_COMPARE_AMPS, { error: 'Drive current must be at least 0.1 mA (0.0001 A)' })
    .max(MAX_COMPARE_AMPS, { error: 'Drive current cannot be more than 100 A' })
    .optional(),
  pwmDuty: z
    .number({ error: 'PWM duty must be a number' })
    .positive({ error: 'PWM duty must be greater than 0' })
    .max(1, { error: 'PWM duty cannot be more than 1' })
    .optional(),
  wiring: wiringSpecSchema.optional(),
  heatSink: heatSinkSpecSchema.optional(),
  ambientC: ambientCSchema.optional(),
}).superRefine((body, ctx) => {
  // Without `amps` the comparison drives the LEDs at 70 % of their rating; that too must reach 0.1 mA.
  if (body.amps !== undefined) return;
  const drive = defaultDriveAmps(body.string.led);
  if (!(drive >= MIN_COMPARE_AMPS))
    ctx.addIssue({
      code: 'custom',
      path: ['amps'],
      message: "Give a drive current: 70 % of the LED's current or power rating is below 0.1 mA",
    });
});

export type CompareBody = z.output<typeof compareBodySchema>;
