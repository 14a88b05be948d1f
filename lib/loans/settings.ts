import 'server-only';
import { z } from 'zod';
import type { Db } from '@/db/connect';
import { NotFoundError } from '@/lib/errors';
import { readRules, type BorrowingRules } from '@/lib/rules/schema';
import type { DueRule } from './due';

// The lending rules of a space. Loan period, closing time, zone, open-loan limit and the reminder
// schedule are columns of `spaces`; the smaller limits live in `spaces.settings.loans` with defaults.
const extraSchema = z.object({
  /** Renewals allowed per loan. */
  maxRenewals: z.number().int().min(0).max(10).catch(1),
  /** Open holds a member may have at once. */
  maxOpenHolds: z.number().int().min(1).max(50).catch(3),
});

export type LoanSettings = DueRule & {
  maxOpenLoans: number;
  reminderDaysBefore: number;
  reminderEveryDays: number;
  maxRenewals: number;
  maxOpenHolds: number;
  spaceName: string;
  /** Air temperature at the bench, °C: the heat check starts from it. */
  ambientC: number;
  /** Standing, opening calendar, presence, reminder pause (spaces.settings.borrowing, lib/rules). */
  rules: BorrowingRules;
};

/** The columns of `spaces` the lending rules come from (a caller may read them with other rows). */
export const LOAN_SETTING_COLUMNS = [
  'spaces.name',
  'spaces.loan_days',
  'spaces.closing_time',
  'spaces.time_zone',
  'spaces.max_open_loans',
  'spaces.reminder_days_before',
  'spaces.reminder_every_days',
  'spaces.ambient_c',
  'spaces.settings',
] as const;

type SettingsRow = {
  name: string;
  loan_days: number;
  closing_time: string;
  time_zone: string;
  max_open_loans: number;
  reminder_days_before: number;
  reminder_every_days: number;
  ambient_c: number;
  settings: unknown;
};

export function toLoanSettings(s: SettingsRow): LoanSettings {
  const loans = (s.settings as Record<string, unknown> | null)?.loans;
  const rules = readRules((s.settings as Record<string, unknown> | null)?.borrowing);
  const extra = extraSchema.parse(typeof loans === 'object' && loans !== null ? loans : {});
  return {
    spaceName: s.name,
    loanDays: s.loan_days,
    closingTime: s.closing_time,
    timeZone: s.time_zone,
    maxOpenLoans: s.max_open_loans,
    reminderDaysBefore: s.reminder_days_before,
    reminderEveryDays: Math.max(1, s.reminder_every_days),
    ambientC: s.ambient_c,
    rules,
    calendar: { week: rules.week, closedDates: rules.closedDates },
    ...extra,
  };
}

export async function loanSettings(db: Db, spaceId: string): Promise<LoanSettings> {
  const s = await db.selectFrom('spaces').select(LOAN_SETTING_COLUMNS).where('id', '=', spaceId).executeTakeFirst();
  if (!s) throw new NotFoundError('No such space.');
  return toLoanSettings(s);
}
