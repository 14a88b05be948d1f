import { TZDate } from '@date-fns/tz';
import { addDays, differenceInCalendarDays, format } from 'date-fns';
import { atLocal, nextOpening, type OpeningCalendar } from '@/lib/rules/calendar';

// Due dates and calendar days in the space's own time zone. Pure: no database, no clock.

export type DueRule = {
  /** Whole days lent for. */
  loanDays: number;
  /** 'HH:MM', the space's closing time, local. */
  closingTime: string;
  /** IANA zone, e.g. 'America/Chicago'. */
  timeZone: string;
  /** Opening days and closed dates (lib/rules); without one, every day closes at `closingTime`. */
  calendar?: OpeningCalendar;
};

function closingParts(closingTime: string): [number, number] {
  const m = /^([01]\d|2[0-3]):([0-5]\d)$/.exec(closingTime);
  if (!m) throw new RangeError(`closing time must be HH:MM, got "${closingTime}"`);
  return [Number(m[1]), Number(m[2])];
}

/**
 * Due at closing time, local, on the last day of the loan: the calendar day `loanDays` after `from`
 * in the space's zone. Counting calendar days (not 24-hour blocks) keeps the due time at the same wall
 * clock across a daylight-saving change, so a week's loan may be 167 or 169 hours long. With an opening
 * calendar, a last day the space is shut moves to the next day it opens, due at that day's closing time.
 */
export function computeDueAt(from: Date, rule: DueRule): Date {
  closingParts(rule.closingTime);
  const lastDay = localDay(addDays(new TZDate(from.getTime(), rule.timeZone), rule.loanDays), rule.timeZone);
  // The next opening on or after the last day, at its closing time: never a night the space is shut.
  const opening = rule.calendar ? nextOpening(lastDay, rule.calendar, rule.closingTime) : null;
  return atLocal(opening?.day ?? lastDay, opening?.closes ?? rule.closingTime, rule.timeZone);
}

/** A renewal runs a fresh loan period from the later of now and the old due date, so renewing early never shortens it. */
export function renewedDueAt(oldDue: Date, at: Date, rule: DueRule): Date {
  return computeDueAt(oldDue > at ? oldDue : at, rule);
}

/** The calendar day ('YYYY-MM-DD') an instant falls on in a zone. */
export function localDay(at: Date, timeZone: string): string {
  return format(new TZDate(at.getTime(), timeZone), 'yyyy-MM-dd');
}

/** Whole calendar days from day `a` to day `b` (both 'YYYY-MM-DD'); positive when b is later. */
export function daysBetween(a: string, b: string): number {
  return differenceInCalendarDays(parseDay(b), parseDay(a));
}

/** 'YYYY-MM-DD' plus n days. */
export function addDaysToDay(day: string, n: number): string {
  return format(addDays(parseDay(day), n), 'yyyy-MM-dd');
}

function parseDay(day: string): Date {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  if (!m) throw new RangeError(`day must be YYYY-MM-DD, got "${day}"`);
  // Local midnight in the process's zone, used only for calendar arithmetic between two such days.
  return new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
}

/** Whole days a loan is late at `at` (0 when not yet due), counted in local calendar days. */
export function daysLate(dueAt: Date, at: Date, timeZone: string): number {
  if (at <= dueAt) return 0;
  return Math.max(1, daysBetween(localDay(dueAt, timeZone), localDay(at, timeZone)));
}
