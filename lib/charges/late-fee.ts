import { localDay } from '@/lib/loans/due';
import { opensOn, plusDays, type OpeningCalendar } from '@/lib/rules/calendar';

// Late fees, pure (no database, no clock). Which days count is our own rule (common practice (no
// source)): a day is late when it is a local day, in the space's zone, after the due day and up to and
// including the day the loan came back, on which the space opens (a shut weekday or a closed date costs
// nothing: nobody could have brought it back). So a loan due Friday evening, the space shut over the
// weekend, brought back Monday is one opening day late. The fee is days × the per-day amount, never
// more than the cap; integer minor units (ISO 4217), so no rounding arises.

export type LateFeeRule = { perOpeningDayMinor: number; capMinor: number };

/** The longest stretch looked through: past it the cap has long been reached. */
const MAX_DAYS = 3660;

export function openingDaysLate(
  dueAt: Date,
  backAt: Date,
  where: { timeZone: string; closingTime: string; calendar: OpeningCalendar },
): number {
  if (backAt.getTime() <= dueAt.getTime()) return 0;
  const dueDay = localDay(dueAt, where.timeZone);
  const backDay = localDay(backAt, where.timeZone);
  let days = 0;
  for (let i = 1, d = plusDays(dueDay, 1); d <= backDay && i <= MAX_DAYS; i++, d = plusDays(dueDay, i))
    if (opensOn(d, where.calendar, where.closingTime)) days += 1;
  return days;
}

export function lateFeeMinor(days: number, rule: LateFeeRule): number {
  return Math.min(days * rule.perOpeningDayMinor, rule.capMinor);
}
