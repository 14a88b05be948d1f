import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { localDay } from '@/lib/loans/due';
import { notifyReadyHolds, type SendFn } from '@/lib/loans/notify';
import { sendMail } from '@/lib/mail/send';
import { deliverReminder } from './deliver';
import { opensOn } from '@/lib/rules/calendar';
import { readRules } from '@/lib/rules/schema';
import { remindedPeople, REMINDER_PAUSE_HOURS } from './pause';
import { reminderOwed } from './schedule';

// The scheduled reminder run. Idempotent: run it as often as you like, from as many processes as you
// like. Step 1 records each reminder a loan is owed today as a 'pending' row (the unique index on
// (loan, kind, for_day) makes a second run insert nothing; a loan within its reminder pause is left
// for later); step 2 sends every pending row, including
// those a crashed run left behind; step 3 sends "your hold is ready" notices that did not go out.

export type SweepResult = { queued: number; sent: number; failed: number; holdNotices: number };

/** `spaceId` limits a run to one space (an admin's "run now", tests); the scheduled run covers all. */
export async function runReminderSweep(
  db: Db,
  at: Date,
  deps: { send?: SendFn; spaceId?: string } = {},
): Promise<SweepResult> {
  const send = deps.send ?? sendMail;
  // across spaces: the scheduled sweep reads every space's open loans (or one space's, when asked).
  let due = db
    .selectFrom('loans')
    .innerJoin('spaces', 'spaces.id', 'loans.space_id')
    .select([
      'loans.id',
      'loans.space_id',
      'loans.out_at',
      'loans.due_at',
      'spaces.time_zone',
      'spaces.reminder_days_before',
      'spaces.reminder_every_days',
      'spaces.closing_time',
      'spaces.settings',
      'loans.borrower_id',
    ])
    .where('loans.status', '=', 'out')
    // Only loans close enough to their due day to be owed anything.
    .where(
      sql<boolean>`loans.due_at < ${at}::timestamptz + make_interval(days => spaces.reminder_days_before + 1)`,
    );
  if (deps.spaceId) due = due.where('loans.space_id', '=', deps.spaceId);
  const loans = await due.execute();

  // A member reminded of any loan within the space's pause (by hand or by schedule, or with a reminder
  // still waiting to go) is not reminded again yet; an owed reminder is recorded by the first run after
  // the pause, if it is still owed then. One reminder per member per run.
  const rulesOf = new Map(loans.map((l) => [l.space_id, readRules((l.settings as Record<string, unknown> | null)?.borrowing)]));
  const hoursOf = (spaceId: string) => rulesOf.get(spaceId)?.reminderPauseHours ?? REMINDER_PAUSE_HOURS;
  const reminded = await remindedPeople(db, loans.map((l) => ({ spaceId: l.space_id, userId: l.borrower_id })), at, hoursOf);
  let queued = 0;
  for (const l of loans) {
    const person = `${l.space_id}:${l.borrower_id}`;
    if (reminded.has(person)) continue;
    // On a day the space is shut nobody can bring anything back: the reminder waits for an open day.
    const rules = rulesOf.get(l.space_id)!;
    if (!opensOn(localDay(at, l.time_zone), { week: rules.week, closedDates: rules.closedDates }, l.closing_time)) continue;
    const slot = reminderOwed(
      { dueDay: localDay(l.due_at, l.time_zone), outDay: localDay(l.out_at, l.time_zone) },
      localDay(at, l.time_zone),
      { daysBefore: l.reminder_days_before, everyDays: l.reminder_every_days },
    );
    if (!slot) continue;
    const row = await scoped(db, { spaceId: l.space_id })
      .insertInto('reminders')
      .values({
        space_id: l.space_id,
        loan_id: l.id,
        kind: slot.kind,
        for_day: slot.forDay,
        status: 'pending',
        created_at: at,
      })
      .onConflict((oc) =>
        oc.columns(['loan_id', 'kind', 'for_day']).where('kind', '<>', 'manual').doNothing(),
      )
      .returning('id')
      .executeTakeFirst();
    if (row) {
      queued++;
      reminded.add(person);
    }
  }

  // across spaces: as above, every space's reminders waiting to go.
  let pendingQuery = db.selectFrom('reminders').select('id').where('status', '=', 'pending');
  if (deps.spaceId) pendingQuery = pendingQuery.where('space_id', '=', deps.spaceId);
  const pending = await pendingQuery.orderBy('created_at').orderBy('id').limit(1000).execute();
  let sent = 0;
  let failed = 0;
  for (const p of pending) {
    // A mail outage throws here and ends the run; the rows stay pending for the next one.
    const outcome = await deliverReminder(db, p.id, at, send);
    if (outcome === 'sent') sent++;
    if (outcome === 'failed') failed++;
  }
  const holdNotices = await notifyReadyHolds(db, 'all-unsent', send, deps.spaceId);
  return { queued, sent, failed, holdNotices };
}
