import { describe, expect, it } from 'vitest';
import { addDaysToDay, computeDueAt, daysBetween, daysLate, localDay, renewedDueAt } from '@/lib/loans/due';

// Wall-clock time of an instant in a zone, read back with the platform's own tz database (ICU), so the
// check does not rely on the code under test.
const wall = (d: Date, timeZone: string) =>
  new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(d);

describe('due date at closing time in the space zone', () => {
  // US daylight saving time begins at 02:00 local on the second Sunday of March (Energy Policy Act of
  // 2005, 15 U.S.C. § 260a): 8 March 2026. Chicago goes from UTC−6 (CST) to UTC−5 (CDT).
  it('keeps the closing time across the US spring change (America/Chicago)', () => {
    const out = new Date('2026-03-05T18:00:00Z'); // Thursday 12:00 CST
    const due = computeDueAt(out, { loanDays: 7, closingTime: '21:00', timeZone: 'America/Chicago' });
    expect(due.toISOString()).toBe('2026-03-13T02:00:00.000Z'); // 12 March 21:00 CDT = 02:00 UTC next day
    expect(wall(due, 'America/Chicago')).toBe('2026-03-12, 21:00');
    // The loan is one hour shorter than 7 × 24 h: the night of the change has 23 hours.
    expect(due.getTime() - out.getTime()).toBe((7 * 24 + 9 - 1) * 3_600_000);
  });

  it('a one-day loan over the change night still ends at closing time', () => {
    const out = new Date('2026-03-07T20:00:00Z'); // Saturday 14:00 CST
    const due = computeDueAt(out, { loanDays: 1, closingTime: '21:00', timeZone: 'America/Chicago' });
    expect(due.toISOString()).toBe('2026-03-09T02:00:00.000Z');
    expect(wall(due, 'America/Chicago')).toBe('2026-03-08, 21:00');
  });

  // EU summer time ends at 01:00 UTC on the last Sunday of October (Directive 2000/84/EC, art. 2):
  // 25 October 2026. Berlin goes from UTC+2 (CEST) to UTC+1 (CET).
  it('keeps the closing time across the EU autumn change (Europe/Berlin)', () => {
    const out = new Date('2026-10-22T10:00:00Z'); // Thursday 12:00 CEST
    const due = computeDueAt(out, { loanDays: 7, closingTime: '18:00', timeZone: 'Europe/Berlin' });
    expect(due.toISOString()).toBe('2026-10-29T17:00:00.000Z'); // 29 October 18:00 CET
    expect(wall(due, 'Europe/Berlin')).toBe('2026-10-29, 18:00');
    // One hour longer than 7 days plus the 6 h to closing: the change night has 25 hours.
    expect(due.getTime() - out.getTime()).toBe((7 * 24 + 6 + 1) * 3_600_000);
  });

  it('counts days from the local date, not the UTC date', () => {
    // 23:30 in Chicago on 5 March is already 6 March in UTC.
    const late = new Date('2026-03-06T05:30:00Z');
    expect(localDay(late, 'America/Chicago')).toBe('2026-03-05');
    const due = computeDueAt(late, { loanDays: 7, closingTime: '21:00', timeZone: 'America/Chicago' });
    expect(wall(due, 'America/Chicago')).toBe('2026-03-12, 21:00');
  });

  it('refuses a closing time that is not HH:MM', () => {
    expect(() => computeDueAt(new Date(), { loanDays: 7, closingTime: '9pm', timeZone: 'UTC' })).toThrow(
      RangeError,
    );
    expect(() => computeDueAt(new Date(), { loanDays: 7, closingTime: '24:00', timeZone: 'UTC' })).toThrow(
      RangeError,
    );
  });
});

describe('renewal', () => {
  const rule = { loanDays: 14, closingTime: '21:00', timeZone: 'America/Chicago' };
  it('runs a fresh period from the old due date when renewed early', () => {
    const oldDue = new Date('2026-03-13T02:00:00Z'); // 12 March 21:00 CDT
    const due = renewedDueAt(oldDue, new Date('2026-03-10T15:00:00Z'), rule);
    expect(wall(due, 'America/Chicago')).toBe('2026-03-26, 21:00');
  });
  it('runs from today when renewed after the due date', () => {
    const oldDue = new Date('2026-03-13T02:00:00Z');
    const due = renewedDueAt(oldDue, new Date('2026-03-15T15:00:00Z'), rule);
    expect(wall(due, 'America/Chicago')).toBe('2026-03-29, 21:00');
  });
});

describe('calendar days', () => {
  it('counts whole days across both changes whatever the machine zone', () => {
    expect(daysBetween('2026-03-07', '2026-03-09')).toBe(2);
    expect(daysBetween('2026-10-24', '2026-10-26')).toBe(2);
    expect(daysBetween('2026-03-09', '2026-03-07')).toBe(-2);
    expect(addDaysToDay('2026-10-24', 3)).toBe('2026-10-27');
    expect(addDaysToDay('2026-12-31', 1)).toBe('2027-01-01');
  });
  it('days late: 0 before due, at least 1 once past, then local calendar days', () => {
    const due = new Date('2026-03-13T02:00:00Z'); // 12 March 21:00 Chicago
    expect(daysLate(due, new Date('2026-03-13T01:59:00Z'), 'America/Chicago')).toBe(0);
    expect(daysLate(due, new Date('2026-03-13T03:00:00Z'), 'America/Chicago')).toBe(1); // same evening
    expect(daysLate(due, new Date('2026-03-16T15:00:00Z'), 'America/Chicago')).toBe(4);
  });
});
