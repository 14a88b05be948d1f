import { describe, expect, it } from 'vitest';
import { lateFeeMinor, openingDaysLate } from '@/lib/charges/late-fee';
import type { Week } from '@/lib/rules/schema';

// Late days are counted on the opening calendar by our own rule (common practice (no source)): local
// days after the due day up to the day it came back, on which the space opens. Cases worked by hand on
// a calendar of November–December 2026 (20 November 2026 is a Friday).

const open = { opens: '10:00', closes: '20:00' };
const weekdays: Week = { mon: open, tue: open, wed: open, thu: open, fri: open, sat: null, sun: null };
const utc = { timeZone: 'UTC', closingTime: '20:00', calendar: { week: weekdays, closedDates: ['2026-11-24'] } };
const due = new Date('2026-11-20T20:00:00Z');

describe('opening days late', () => {
  it('is 0 when back by the due time, or later the same day', () => {
    expect(openingDaysLate(due, new Date('2026-11-20T19:59:00Z'), utc)).toBe(0);
    expect(openingDaysLate(due, new Date('2026-11-20T23:00:00Z'), utc)).toBe(0);
  });
  it('skips a shut weekend and a closed date: back Wednesday 25th → Mon 23 and Wed 25', () => {
    expect(openingDaysLate(due, new Date('2026-11-25T12:00:00Z'), utc)).toBe(2);
  });
  it('back on the Monday after a shut weekend is one opening day late', () => {
    expect(openingDaysLate(due, new Date('2026-11-23T09:00:00Z'), utc)).toBe(1);
  });
  it('without a calendar every day counts', () => {
    const always = { ...utc, calendar: { week: null, closedDates: [] } };
    expect(openingDaysLate(due, new Date('2026-11-25T12:00:00Z'), always)).toBe(5);
  });
  it('counts local days in the space’s zone: 02:00 UTC on the 21st is still the 20th in Chicago', () => {
    const chicago = { ...utc, timeZone: 'America/Chicago', calendar: { week: null, closedDates: [] } };
    const dueChicago = new Date('2026-11-21T02:00:00Z'); // 20:00 on Friday the 20th, UTC−06:00
    expect(openingDaysLate(dueChicago, new Date('2026-11-21T05:00:00Z'), chicago)).toBe(0); // 23:00 the same day
    expect(openingDaysLate(dueChicago, new Date('2026-11-21T07:00:00Z'), chicago)).toBe(1); // 01:00 Saturday
  });
});

describe('the fee', () => {
  it('is days × the amount per day, never more than the cap (minor units, ISO 4217)', () => {
    const rule = { perOpeningDayMinor: 150, capMinor: 400 };
    expect(lateFeeMinor(2, rule)).toBe(300);
    expect(lateFeeMinor(7, rule)).toBe(400);
    expect(lateFeeMinor(0, rule)).toBe(0);
  });
});
