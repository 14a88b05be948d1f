import { describe, expect, it } from 'vitest';
import { reminderOwed } from '@/lib/reminders/schedule';

// The reminder timetable is the product's own rule (two days before, on the day, then every few days):
// common practice (no source).
const rule = { daysBefore: 2, everyDays: 3 };
const loan = { outDay: '2026-03-05', dueDay: '2026-03-12' };

describe('which reminder a loan is owed on a day', () => {
  it('nothing while the due day is far', () => {
    expect(reminderOwed(loan, '2026-03-06', rule)).toBeNull();
    expect(reminderOwed(loan, '2026-03-09', rule)).toBeNull();
  });
  it('before due, named by its day, so a missed day is caught up once', () => {
    expect(reminderOwed(loan, '2026-03-10', rule)).toEqual({ kind: 'before_due', forDay: '2026-03-10' });
    expect(reminderOwed(loan, '2026-03-11', rule)).toEqual({ kind: 'before_due', forDay: '2026-03-10' });
  });
  it('on the due day', () => {
    expect(reminderOwed(loan, '2026-03-12', rule)).toEqual({ kind: 'due_day', forDay: '2026-03-12' });
  });
  it('the day after, then every third day while overdue', () => {
    expect(reminderOwed(loan, '2026-03-13', rule)).toEqual({ kind: 'overdue', forDay: '2026-03-13' });
    expect(reminderOwed(loan, '2026-03-15', rule)).toEqual({ kind: 'overdue', forDay: '2026-03-13' });
    expect(reminderOwed(loan, '2026-03-16', rule)).toEqual({ kind: 'overdue', forDay: '2026-03-16' });
    expect(reminderOwed(loan, '2026-03-22', rule)).toEqual({ kind: 'overdue', forDay: '2026-03-22' });
  });
  it('no "due soon" for a loan that began inside the warning window', () => {
    expect(reminderOwed({ outDay: '2026-03-11', dueDay: '2026-03-12' }, '2026-03-11', rule)).toBeNull();
  });
  it('every day when the space says so, and no early reminder when it is off', () => {
    expect(reminderOwed(loan, '2026-03-14', { daysBefore: 0, everyDays: 1 })).toEqual({
      kind: 'overdue',
      forDay: '2026-03-14',
    });
    expect(reminderOwed(loan, '2026-03-11', { daysBefore: 0, everyDays: 1 })).toBeNull();
  });
});
