import { describe, expect, test } from 'vitest';
import { computeDueAt, renewedDueAt } from '@/lib/loans/due';
import { closingOn, nextOpening, plusDays, weekdayOf } from '@/lib/rules/calendar';
import { borrowingRulesSchema, readRules, DEFAULT_RULES, type Week } from '@/lib/rules/schema';

// Due dates on an opening calendar, worked by hand. Offsets: Europe/Berlin is UTC+1 in winter (CET)
// and UTC+2 in summer (CEST), changing on the last Sundays of March and October; America/Chicago is
// UTC−5 (CDT) until the first Sunday of November, then UTC−6 (CST) — the zone rules of the IANA tz
// database, which Intl reads.

const HOURS = { opens: '10:00', closes: '18:00' };
const BERLIN_WEEK: Week = { mon: HOURS, tue: HOURS, wed: HOURS, thu: HOURS, fri: HOURS, sat: { opens: '10:00', closes: '14:00' }, sun: null };

describe('calendar days', () => {
  test('weekdays and day arithmetic', () => {
    expect(weekdayOf('2026-12-24')).toBe('thu');
    expect(weekdayOf('2026-12-27')).toBe('sun');
    expect(weekdayOf('2026-11-01')).toBe('sun');
    expect(plusDays('2026-12-30', 3)).toBe('2027-01-02');
    expect(plusDays('2028-02-28', 1)).toBe('2028-02-29');
  });

  test('closing time per day: weekday hours, closed weekdays, closed dates', () => {
    const cal = { week: BERLIN_WEEK, closedDates: ['2026-12-24'] };
    expect(closingOn('2026-12-23', cal, '20:00')).toBe('18:00');
    expect(closingOn('2026-12-24', cal, '20:00')).toBeNull();
    expect(closingOn('2026-12-26', cal, '20:00')).toBe('14:00');
    expect(closingOn('2026-12-27', cal, '20:00')).toBeNull();
    // Without a week, every day but the closed dates closes at the space's closing time.
    expect(closingOn('2026-12-27', { week: null, closedDates: [] }, '20:00')).toBe('20:00');
    expect(nextOpening('2026-12-27', { week: null, closedDates: ['2026-12-27'] }, '20:00')).toEqual({ day: '2026-12-28', closes: '20:00' });
  });
});

describe('due dates fall on the next opening, at its closing time', () => {
  test('over a holiday: Christmas Eve to Boxing Day shut, then a Sunday → Monday 28 Dec, 18:00 CET', () => {
    // Out Thursday 17 Dec 2026, 15:00 in Berlin (14:00 UTC), for 7 days: the last day is Thu 24 Dec,
    // a closed date; 25 and 26 are closed dates too, 27 is a Sunday (shut). Monday 28 opens until 18:00,
    // which is 17:00 UTC in winter.
    const rule = {
      loanDays: 7,
      closingTime: '20:00',
      timeZone: 'Europe/Berlin',
      calendar: { week: BERLIN_WEEK, closedDates: ['2026-12-24', '2026-12-25', '2026-12-26'] },
    };
    expect(computeDueAt(new Date('2026-12-17T14:00:00Z'), rule).toISOString()).toBe('2026-12-28T17:00:00.000Z');
    // The same loan with no holidays: due Thursday 24 Dec at 18:00 CET = 17:00 UTC.
    expect(computeDueAt(new Date('2026-12-17T14:00:00Z'), { ...rule, calendar: { week: BERLIN_WEEK, closedDates: [] } }).toISOString()).toBe(
      '2026-12-24T17:00:00.000Z',
    );
    // Out at 00:30 local on Friday 18 Dec (23:30 UTC on the 17th): the local day counts, the last day is
    // Fri 25 Dec (closed), then 26 (closed), 27 (Sunday) → Monday 28 again.
    expect(computeDueAt(new Date('2026-12-17T23:30:00Z'), rule).toISOString()).toBe('2026-12-28T17:00:00.000Z');
  });

  test('a Saturday due date closes early: Saturday 19 Dec 2026, 14:00 CET = 13:00 UTC', () => {
    const rule = { loanDays: 2, closingTime: '20:00', timeZone: 'Europe/Berlin', calendar: { week: BERLIN_WEEK, closedDates: [] } };
    expect(computeDueAt(new Date('2026-12-17T14:00:00Z'), rule).toISOString()).toBe('2026-12-19T13:00:00.000Z');
  });

  test('across the autumn clock change in Chicago: Sunday and Monday shut → Tuesday 3 Nov, 21:00 CST', () => {
    // Out Saturday 24 Oct 2026, 20:00 CDT (01:00 UTC on the 25th), for 8 days: the last day is Sunday
    // 1 Nov, the day the clocks go back; the space opens Tuesday to Saturday, so Tuesday 3 Nov at 21:00
    // CST (UTC−6) = 03:00 UTC on the 4th. The same wall-clock time before the change was 02:00 UTC.
    const noon9 = { opens: '12:00', closes: '21:00' };
    const week: Week = { mon: null, tue: noon9, wed: noon9, thu: noon9, fri: noon9, sat: noon9, sun: null };
    const rule = { loanDays: 8, closingTime: '21:00', timeZone: 'America/Chicago', calendar: { week, closedDates: [] } };
    const due = computeDueAt(new Date('2026-10-25T01:00:00Z'), rule);
    expect(due.toISOString()).toBe('2026-11-04T03:00:00.000Z');
    // 10 days and 2 hours: 242 hours, one more than the wall clocks show, because of the extra hour.
    expect((due.getTime() - Date.parse('2026-10-25T01:00:00Z')) / 3_600_000).toBe(242);
  });

  test('across the spring change in Berlin: Sunday 28 Mar 2027 shut → Monday 29 Mar, 18:00 CEST = 16:00 UTC', () => {
    const rule = { loanDays: 7, closingTime: '20:00', timeZone: 'Europe/Berlin', calendar: { week: BERLIN_WEEK, closedDates: [] } };
    // Out Sunday 21 Mar 2027 at 12:00 CET (11:00 UTC); the last day, Sunday 28 Mar, is shut.
    expect(computeDueAt(new Date('2027-03-21T11:00:00Z'), rule).toISOString()).toBe('2027-03-29T16:00:00.000Z');
  });

  test('a renewal lands on an opening too', () => {
    const rule = { loanDays: 7, closingTime: '20:00', timeZone: 'Europe/Berlin', calendar: { week: BERLIN_WEEK, closedDates: ['2026-12-31'] } };
    // Renewed on Thu 24 Dec 2026 (old due date the 24th, 17:00 UTC): +7 → Thu 31 Dec, a closed date → Fri 1 Jan 2027, 18:00 CET.
    expect(renewedDueAt(new Date('2026-12-24T17:00:00Z'), new Date('2026-12-20T10:00:00Z'), rule).toISOString()).toBe(
      '2027-01-01T17:00:00.000Z',
    );
  });

  test('without a calendar, due dates are as before: the last day at the closing time', () => {
    const rule = { loanDays: 7, closingTime: '20:00', timeZone: 'Europe/Berlin' };
    expect(computeDueAt(new Date('2026-12-17T14:00:00Z'), rule).toISOString()).toBe('2026-12-24T19:00:00.000Z');
  });
});

describe('stored rules', () => {
  test('missing or unreadable fields fall back to their defaults, one by one', () => {
    expect(readRules(undefined)).toEqual(DEFAULT_RULES);
    expect(readRules({ refuseWhileOverdue: false, reminderPauseHours: 'soon', presence: 'bench_handover' })).toEqual({
      ...DEFAULT_RULES,
      refuseWhileOverdue: false,
      presence: 'bench_handover',
    });
  });

  test('a week that never opens is refused, naming a day', () => {
    const shut = Object.fromEntries(Object.keys(BERLIN_WEEK).map((d) => [d, null]));
    const r = borrowingRulesSchema.shape.week.safeParse(shut);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(['mon']);
  });

  test('closed dates are kept sorted and once each', () => {
    const r = borrowingRulesSchema.shape.closedDates.parse(['2026-12-25', '2026-12-24', '2026-12-25']);
    expect(r).toEqual(['2026-12-24', '2026-12-25']);
  });
});
