import { z } from 'zod';
import { isRealDay } from '@/lib/inductions/schemas';
import type { PartCategory } from '@/lib/domain';
import { CATEGORIES } from '@/lib/inventory/words';

// The rules a space sets for who may borrow, and when things fall due. Kept in `spaces.settings.borrowing`
// (one JSON object), read with defaults so a space that never saved them lends as before.

export const WEEKDAYS = ['mon', 'tue', 'wed', 'thu', 'fri', 'sat', 'sun'] as const;
export type Weekday = (typeof WEEKDAYS)[number];
export const WEEKDAY_NAMES: Record<Weekday, string> = {
  mon: 'Monday',
  tue: 'Tuesday',
  wed: 'Wednesday',
  thu: 'Thursday',
  fri: 'Friday',
  sat: 'Saturday',
  sun: 'Sunday',
};

const hhmm = (field: string) =>
  z
    .string({ error: `${field}: a time as HH:MM` })
    .regex(/^([01]\d|2[0-3]):[0-5]\d$/, `${field}: a 24-hour time as HH:MM, e.g. 18:00`);

/** One weekday's opening: from `opens` to `closes`, local time. */
export const openingSchema = z
  .object({ opens: hhmm('opens'), closes: hhmm('closes') })
  .strict()
  .refine((o) => o.opens < o.closes, { error: 'closes must be later than opens', path: ['closes'] })
  .describe('Opening hours of one weekday: closes must be later than opens.');
export type Opening = z.infer<typeof openingSchema>;

const day = z
  .string({ error: 'a date as YYYY-MM-DD' })
  .regex(/^\d{4}-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/, 'a date as YYYY-MM-DD')
  .refine(isRealDay, 'no such date')
  .meta({ format: 'date' });

/** Per weekday: its opening hours, or null when the space is shut that day. */
export const weekSchema = z
  .object(Object.fromEntries(WEEKDAYS.map((d) => [d, openingSchema.nullable()])) as Record<Weekday, z.ZodNullable<typeof openingSchema>>)
  .strict()
  .refine((w) => WEEKDAYS.some((d) => w[d] !== null), { error: 'open on at least one day of the week', path: ['mon'] });
export type Week = z.infer<typeof weekSchema>;

export const PRESENCE = ['self_service', 'bench_handover'] as const;
export type Presence = (typeof PRESENCE)[number];
export const PRESENCE_NAMES: Record<Presence, string> = {
  self_service: 'Members help themselves: a borrow or return counts at once',
  bench_handover: 'Things change hands at the bench: a steward hands over and checks returns',
};

export const MAX_CLOSED_DATES = 400;

const categoryDeposit = (c: string) =>
  z
    .number({ error: `categoryDepositsMinor.${c}: a whole number of minor units` })
    .int(`categoryDepositsMinor.${c}: a whole number of minor units`)
    .min(1, `categoryDepositsMinor.${c}: at least 1`)
    .max(99_999_999, `categoryDepositsMinor.${c}: at most 99999999`);

export const borrowingRulesSchema = z
  .object({
    /** No new loan while one of the member's loans is past its due date. */
    refuseWhileOverdue: z.boolean({ error: 'refuseWhileOverdue must be true or false' }),
    /**
     * No new loan while the member owes more than this, in the space's currency (ISO 4217 minor units):
     * charges less what deposits covered and what was settled. null: no such rule.
     */
    refuseWhenOwingOverMinor: z
      .number({ error: 'refuseWhenOwingOverMinor: a whole number of minor units, or null' })
      .int('refuseWhenOwingOverMinor: a whole number of minor units')
      .min(0, 'refuseWhenOwingOverMinor: 0 or more')
      .max(99_999_999, 'refuseWhenOwingOverMinor: at most 99999999')
      .nullable(),
    /**
     * A late fee where the space wants one (null: off, the default): so much per opening day late, never
     * more than the cap, in the space's currency (ISO 4217 minor units). Raised once when a late return
     * is confirmed (lib/charges/late-fee.ts).
     */
    lateFee: z
      .object({
        perOpeningDayMinor: z
          .number({ error: 'lateFee.perOpeningDayMinor: a whole number of minor units' })
          .int('lateFee.perOpeningDayMinor: a whole number of minor units')
          .min(1, 'lateFee.perOpeningDayMinor: at least 1')
          .max(99_999_999, 'lateFee.perOpeningDayMinor: at most 99999999'),
        capMinor: z
          .number({ error: 'lateFee.capMinor: a whole number of minor units' })
          .int('lateFee.capMinor: a whole number of minor units')
          .min(1, 'lateFee.capMinor: at least 1')
          .max(99_999_999, 'lateFee.capMinor: at most 99999999'),
      })
      .strict()
      .nullable(),
    /**
     * Deposits on loose parts: an amount per part category (ISO 4217 minor units), taken when a loose
     * borrow includes parts of that category — once per category, summed over the categories in the loan.
     * A kit box's deposit is its template's alone.
     */
    categoryDepositsMinor: z
      .object(
        Object.fromEntries(CATEGORIES.map((c) => [c, categoryDeposit(c).optional()])) as Record<
          PartCategory,
          z.ZodOptional<ReturnType<typeof categoryDeposit>>
        >,
      )
      .strict(),
    /** The scheduled sweep leaves a member alone this long after any reminder, by hand or scheduled. */
    reminderPauseHours: z
      .number({ error: 'reminderPauseHours: a whole number of hours' })
      .int('reminderPauseHours: a whole number of hours')
      .min(1, 'reminderPauseHours: at least 1')
      .max(336, 'reminderPauseHours: at most 336 (two weeks)'),
    presence: z.enum(PRESENCE, { error: `presence: one of ${PRESENCE.join(', ')}` }),
    /** Opening hours per weekday; null: no calendar, every day closes at the space's closing time. */
    week: weekSchema.nullable(),
    /** Days the space stays shut whatever the weekday (holidays), 'YYYY-MM-DD' local. */
    closedDates: z
      .array(day)
      .max(MAX_CLOSED_DATES, `at most ${MAX_CLOSED_DATES} closed dates`)
      .transform((ds) => [...new Set(ds)].sort()),
  })
  .strict();
export type BorrowingRules = z.output<typeof borrowingRulesSchema>;
export type BorrowingRulesInput = z.input<typeof borrowingRulesSchema>;

export const DEFAULT_RULES: BorrowingRules = {
  refuseWhileOverdue: true,
  refuseWhenOwingOverMinor: null,
  lateFee: null,
  categoryDepositsMinor: {},
  reminderPauseHours: 12,
  presence: 'self_service',
  week: null,
  closedDates: [],
};

/** A PUT sends the whole object; a PATCH-like partial is merged over the stored rules first. */
export const borrowingRulesPatchSchema = borrowingRulesSchema
  .partial()
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), { error: 'send at least one rule', path: ['(body)'] })
  .describe('Send at least one rule.');
export type BorrowingRulesPatch = z.output<typeof borrowingRulesPatchSchema>;

/** Stored rules, each field falling back to its default when missing or unreadable. */
export function readRules(stored: unknown): BorrowingRules {
  const src = typeof stored === 'object' && stored !== null ? (stored as Record<string, unknown>) : {};
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(DEFAULT_RULES) as (keyof BorrowingRules)[]) {
    const parsed = borrowingRulesSchema.shape[key].safeParse(src[key]);
    out[key] = parsed.success ? parsed.data : DEFAULT_RULES[key];
  }
  return out as BorrowingRules;
}
