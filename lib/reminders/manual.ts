import 'server-only';
import type { Db } from '@/db/connect';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { localDay } from '@/lib/loans/due';
import type { SendFn } from '@/lib/loans/notify';
import { sendMail } from '@/lib/mail/send';
import { deliverReminder } from './deliver';

// "Send a reminder now" from the steward's round, for one loan or many. Each is recorded as a 'manual'
// reminder first (committed, pending), then sent the same way the sweep sends: if mail is down the
// request fails and the sweep sends the recorded reminders once mail is back.
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
    const loans = await trx
      .selectFrom('loans')
      .select(['id', 'status'])
      .where('space_id', '=', ctx.spaceId)
      .where('id', 'in', ids)
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
      .select('time_zone')
      .where('id', '=', ctx.spaceId)
      .executeTakeFirstOrThrow();
    const rows = await trx
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
