import { z } from 'zod';
import { LAYOUT_IDS } from '@/labels/layouts';
import { MAX_AMBIENT_C, MIN_AMBIENT_C } from '@/lib/electrical';

// The rules a space runs by. One schema for the form, the route handler and the service.

/** IANA zone names this runtime knows (Intl), plus plain UTC, which Intl lists only as an alias. */
export const TIME_ZONES: readonly string[] = ['UTC', ...Intl.supportedValuesOf('timeZone')];
const zoneSet = new Set(TIME_ZONES);

/** ISO 4217 alphabetic codes of currencies in use, as this runtime's Intl knows them. */
export const CURRENCIES: readonly string[] = Intl.supportedValuesOf('currency');
const currencySet = new Set(CURRENCIES);

/** The range the compatibility check accepts for the ambient temperature (one source: the check). */
export const AMBIENT_MIN_C = MIN_AMBIENT_C;
export const AMBIENT_MAX_C = MAX_AMBIENT_C;

const whole = (what: string, min: number, max: number) =>
  z
    .number({ error: `a whole number of ${what}` })
    .int(`a whole number of ${what}`)
    .min(min, `at least ${min}`)
    .max(max, `at most ${max}`);

export const settingsSchema = z.object({
  name: z.string({ error: 'a name' }).trim().min(1, 'enter a name').max(120, 'at most 120 characters'),
  loanDays: whole('days', 1, 365),
  closingTime: z
    .string({ error: 'a time as HH:MM' })
    .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'a 24-hour time as HH:MM, e.g. 20:00'),
  timeZone: z
    .string({ error: 'a time zone' })
    .refine((v) => zoneSet.has(v), 'a time-zone name such as Europe/Berlin or America/Chicago')
    .meta({ enum: [...TIME_ZONES] }),
  currency: z
    .string({ error: 'a currency code' })
    .trim()
    .toUpperCase()
    .refine((v) => currencySet.has(v), 'a three-letter ISO 4217 currency code such as USD or EUR')
    .meta({ enum: [...CURRENCIES] }),
  maxOpenLoans: whole('loans', 1, 100),
  /** 0 means no reminder before the due day. */
  reminderDaysBefore: whole('days', 0, 30),
  reminderEveryDays: whole('days', 1, 30),
  labelLayout: z.enum(LAYOUT_IDS, { error: `one of ${LAYOUT_IDS.join(', ')}` }),
  /** Air temperature at the bench: where the heat check starts every junction temperature. */
  ambientC: z
    .number({ error: 'a temperature in °C' })
    .finite('a temperature in °C')
    .min(AMBIENT_MIN_C, `at least ${AMBIENT_MIN_C} °C`)
    .max(AMBIENT_MAX_C, `at most ${AMBIENT_MAX_C} °C`),
});
export type Settings = z.infer<typeof settingsSchema>;
export type SettingsFormInput = z.input<typeof settingsSchema>;

/** A PATCH may send any subset of the fields, but at least one. */
export const settingsPatchSchema = settingsSchema
  .partial()
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    message: 'send at least one setting',
    path: ['(body)'],
  });
export type SettingsPatch = z.infer<typeof settingsPatchSchema>;
