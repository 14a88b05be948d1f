import { TZDate } from '@date-fns/tz';
import { WEEKDAYS, type Week } from './schema';

// A space's opening calendar: which local days it opens, and when it closes. Pure: no database, no
// clock. Days are 'YYYY-MM-DD' in the space's zone; the arithmetic is on calendar days (UTC noon
// anchors), so a daylight-saving change never shifts a day.

export type OpeningCalendar = {
  /** Opening hours per weekday; null: no calendar, every day is open and closes at `closingTime`. */
  week: Week | null;
  /** Local days the space stays shut whatever the weekday. */
  closedDates: string[];
};

/** The longest run of shut days looked through before giving up (a year and a bit). */
const LOOKAHEAD_DAYS = 400;

function dayParts(day: string): [number, number, number] {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  if (!m) throw new RangeError(`day must be YYYY-MM-DD, got "${day}"`);
  return [Number(m[1]), Number(m[2]), Number(m[3])];
}

/** 'YYYY-MM-DD' plus n calendar days. */
export function plusDays(day: string, n: number): string {
  const [y, m, d] = dayParts(day);
  return new Date(Date.UTC(y, m - 1, d + n, 12)).toISOString().slice(0, 10);
}

/** The weekday key of a local day. */
export function weekdayOf(day: string): (typeof WEEKDAYS)[number] {
  const [y, m, d] = dayParts(day);
  // getUTCDay: 0 is Sunday; WEEKDAYS starts on Monday.
  return WEEKDAYS[(new Date(Date.UTC(y, m - 1, d, 12)).getUTCDay() + 6) % 7];
}

/** When the space closes on `day` (local 'HH:MM'), or null when it does not open that day. */
export function closingOn(day: string, cal: OpeningCalendar, closingTime: string): string | null {
  if (cal.closedDates.includes(day)) return null;
  if (!cal.week) return closingTime;
  return cal.week[weekdayOf(day)]?.closes ?? null;
}

/** Whether the space opens at all on `day`. */
export const opensOn = (day: string, cal: OpeningCalendar, closingTime: string) => closingOn(day, cal, closingTime) !== null;

/**
 * The first day on or after `day` the space opens, with its closing time; null when nothing opens in
 * the look-ahead (a calendar the settings form cannot save, but stored data is read defensively).
 */
export function nextOpening(day: string, cal: OpeningCalendar, closingTime: string): { day: string; closes: string } | null {
  for (let i = 0; i <= LOOKAHEAD_DAYS; i++) {
    const d = plusDays(day, i);
    const closes = closingOn(d, cal, closingTime);
    if (closes) return { day: d, closes };
  }
  return null;
}

/** The instant local `day` at `hhmm` in `timeZone` (a wall-clock time, whatever the offset that day). */
export function atLocal(day: string, hhmm: string, timeZone: string): Date {
  const [y, m, d] = dayParts(day);
  const [h, min] = hhmm.split(':').map(Number);
  return new Date(new TZDate(y, m - 1, d, h, min, 0, 0, timeZone).getTime());
}
