import { addDaysToDay, daysBetween } from '@/lib/loans/due';

// Which scheduled reminder a loan is owed on a given local day. Pure, so the rules are easy to test:
//   before_due — `daysBefore` days ahead of the due day (once; only if the loan began before that day);
//   due_day    — on the due day;
//   overdue    — the day after the due day, then every `everyDays` days while it stays out.
// Each reminder is named by (kind, for_day); the sweep records it under that name exactly once, so a
// day the sweep missed is caught up once, never repeated.

export type ReminderRule = { daysBefore: number; everyDays: number };
export type ReminderSlot = { kind: 'before_due' | 'due_day' | 'overdue'; forDay: string };

export function reminderOwed(
  loan: { dueDay: string; outDay: string },
  today: string,
  rule: ReminderRule,
): ReminderSlot | null {
  const sinceDue = daysBetween(loan.dueDay, today);
  if (sinceDue >= 1) {
    const every = Math.max(1, rule.everyDays);
    const step = Math.floor((sinceDue - 1) / every);
    return { kind: 'overdue', forDay: addDaysToDay(loan.dueDay, 1 + step * every) };
  }
  if (sinceDue === 0) return { kind: 'due_day', forDay: loan.dueDay };
  if (rule.daysBefore > 0 && -sinceDue <= rule.daysBefore) {
    const forDay = addDaysToDay(loan.dueDay, -rule.daysBefore);
    if (daysBetween(loan.outDay, forDay) > 0) return { kind: 'before_due', forDay };
  }
  return null;
}
