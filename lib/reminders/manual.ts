import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { localDay } from '@/lib/loans/due';
import type { SendFn } from '@/lib/loans/notify';
import { sendMail } from '@/lib/mail/send';
import { formatDateTime } from '@/lib/format';
import { deliverReminder } from './deliver';
import { readRules } from '@/lib/rules/schema';
import { pausedUntil } from './pause';

// "Send a reminder now" from the steward's round, for one loan or many. Each is recorded as a 'manual'
// reminder first (committed, pending), then sent the same way the sweep sends: if mail is down the
// request fails and the sweep sends the recorded reminders once mail is back. A loan reminded within
// the pause (lib/reminders/pause.ts) is refused with the time the next may go, and nothing is sent.
export async function sendManualReminders(
  db: Db,
  ctx: Ctx,
  loanIds: string[],
  send: SendFn = sendMail,
): Promise<{ sent: number; failed: number }> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  const ids = [...new Set(loanIds)];
  const at = now();
  const reminderIds = await db.transaction().execute(async (trx) => {
    // Locked, so two stewards pressing the button at once cannot both pass the pause check.
    const loans = await scoped(trx, ctx)
      .selectFrom('loans')
      .innerJoin('users', 'users.id', 'loans.borrower_id')
      .select(['loans.id', 'loans.status', 'users.name as borrower'])
      .where('loans.space_id', '=', ctx.spaceId)
      .where('loans.id', 'in', ids)
      .orderBy('loans.id')
      .forUpdate('loans')
      .execute();
    ids.forEach((id) => {
      const l = loans.find((x) => x.id === id);
      if (!l) throw new NotFoundError('No such loan.');
      if (l.status !== 'out')
        throw new ConflictError('That loan is already returned.', {
          [`loanIds.${loanIds.indexOf(id)}`]: ['returned'],
        });
    });
    const space = await trx
      .selectFrom('spaces')
      .select(['time_zone', 'settings'])
      .where('id', '=', ctx.spaceId)
      .executeTakeFirstOrThrow();
    const pauseHours = readRules((space.settings as Record<string, unknown> | null)?.borrowing).reminderPauseHours;
    const paused = await pausedUntil(trx, ids, at, pauseHours);
    ids.forEach((id) => {
      const until = paused.get(id);
      if (!until) return;
      const who = loans.find((x) => x.id === id)?.borrower ?? 'The borrower';
      throw new ConflictError(
        `${who} was reminded of this loan less than ${pauseHours} hours ago; the next reminder can go at ${formatDateTime(until, space.time_zone)}.`,
        { [`loanIds.${loanIds.indexOf(id)}`]: [`reminded recently; next from ${formatDateTime(until, space.time_zone)}`] },
      );
    });
    const rows = await scoped(trx, ctx)
      .insertInto('reminders')
      .values(
        ids.map((id) => ({
          space_id: ctx.spaceId,
          loan_id: id,
          kind: 'manual' as const,
          for_day: localDay(at, space.time_zone),
          sent_by: ctx.userId,
          status: 'pending' as const,
          created_at: at,
        })),
      )
      .returning('id')
      .execute();
    return rows.map((r) => r.id);
  });
  let sent = 0;
  let failed = 0;
  for (const id of reminderIds) {
    const outcome = await deliverReminder(db, id, at, send);
    if (outcome === 'sent') sent++;
    if (outcome === 'failed') failed++;
  }
  return { sent, failed };
}
