import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';

// A loan's borrower hears from us at most once per pause, however the reminders come: by hand from the
// steward's round or from the scheduled sweep. A reminder counts from when it went out, or from when it
// was recorded if it is still waiting to go (mail was down); a failed one does not count.

/** The shortest time between two reminders of one loan, manual or scheduled. */
export const REMINDER_PAUSE_HOURS = 12;
const PAUSE_MS = REMINDER_PAUSE_HOURS * 3_600_000;

/** For each of `loanIds` reminded within the pause before `at`: when the next reminder may go. */
export async function pausedUntil(db: Db, loanIds: string[], at: Date): Promise<Map<string, Date>> {
  if (!loanIds.length) return new Map();
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
