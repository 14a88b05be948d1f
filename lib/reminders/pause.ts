import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';

// A loan's borrower hears from us at most once per pause, however the reminders come: by hand from the
// steward's round or from the scheduled sweep. A reminder counts from when it went out, or from when it
// was recorded if it is still waiting to go (mail was down); a failed one does not count.

/**
 * The shortest time between two reminders of one loan, manual or scheduled, when a space has not set
 * its own (spaces.settings.borrowing.reminderPauseHours, lib/rules; Settings → Borrowing rules).
 */
export const REMINDER_PAUSE_HOURS = 12;

/** For each of `loanIds` reminded within the pause before `at`: when the next reminder may go. */
export async function pausedUntil(
  db: Db,
  loanIds: string[],
  at: Date,
  hours: number = REMINDER_PAUSE_HOURS,
): Promise<Map<string, Date>> {
  if (!loanIds.length) return new Map();
  const PAUSE_MS = hours * 3_600_000;
  // across spaces: the loan ids come from a scoped read, or from the sweep over every space.
  const rows = await db
    .selectFrom('reminders')
    .select(['loan_id', sql<Date>`max(coalesce(sent_at, created_at))`.as('last')])
    .where('loan_id', 'in', loanIds)
    .where((eb) =>
      eb.or([
        eb('status', '=', 'pending'),
        eb.and([eb('status', '=', 'sent'), eb('sent_at', '>', new Date(at.getTime() - PAUSE_MS))]),
      ]),
    )
    .groupBy('loan_id')
    .execute();
  return new Map(rows.map((r) => [r.loan_id, new Date(new Date(r.last).getTime() + PAUSE_MS)]));
}

/**
 * People (as `spaceId:userId`) reminded of any of their loans in that space within `hoursOf(spaceId)`
 * before `at`, by hand or by schedule, or with a reminder still waiting to go: the scheduled sweep
 * leaves them alone, so a member with several loans is not written to again and again.
 */
export async function remindedPeople(
  db: Db,
  people: { spaceId: string; userId: string }[],
  at: Date,
  hoursOf: (spaceId: string) => number,
): Promise<Set<string>> {
  if (!people.length) return new Set();
  // across spaces: the sweep runs over every space; each row keeps its own space_id in the answer.
  const rows = await db
    .selectFrom('reminders as r')
    .innerJoin('loans as l', 'l.id', 'r.loan_id')
    .select(['l.space_id', 'l.borrower_id', sql<Date>`max(coalesce(r.sent_at, r.created_at))`.as('last'), sql<boolean>`bool_or(r.status = 'pending')`.as('waiting')])
    .where('l.borrower_id', 'in', [...new Set(people.map((p) => p.userId))])
    .where('r.status', 'in', ['pending', 'sent'])
    .groupBy(['l.space_id', 'l.borrower_id'])
    .execute();
  return new Set(
    rows
      .filter((r) => r.waiting || new Date(r.last).getTime() > at.getTime() - hoursOf(r.space_id) * 3_600_000)
      .map((r) => `${r.space_id}:${r.borrower_id}`),
  );
}
