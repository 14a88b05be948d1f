import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { InvalidError } from '@/lib/errors';
import { env } from '@/lib/env';
import { daysLate } from '@/lib/loans/due';
import type { SendFn } from '@/lib/loans/notify';
import { reminderMail } from '@/lib/mail/loans';

// Sends one recorded reminder. The row was inserted 'pending' (and committed) before; here it is
// locked (skip locked: another sweep working on it is left alone), the mail goes out, and the row is
// marked 'sent' in the same transaction. A crash before the commit leaves it 'pending' for the next
// sweep; a concurrent sweep never sends the same row.

export type DeliverOutcome = 'sent' | 'failed' | 'skipped';

export async function deliverReminder(
  db: Db,
  reminderId: string,
  at: Date,
  send: SendFn,
): Promise<DeliverOutcome> {
  return db.transaction().execute(async (trx) => {
    // across spaces: the sweep hands over reminder ids of every space; the row names its own space.
    const r = await trx
      .selectFrom('reminders')
      .innerJoin('loans', 'loans.id', 'reminders.loan_id')
      .innerJoin('users', 'users.id', 'loans.borrower_id')
      .innerJoin('spaces', 'spaces.id', 'reminders.space_id')
      .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
      .select([
        'reminders.id',
        'reminders.kind',
        'reminders.for_day',
        'reminders.sent_by',
        'reminders.space_id',
        'loans.id as loanId',
        'loans.status',
        'loans.due_at',
        'users.email',
        'users.name',
        'spaces.name as spaceName',
        'spaces.time_zone',
        'kit_boxes.name as boxName',
      ])
      .where('reminders.id', '=', reminderId)
      .where('reminders.status', '=', 'pending')
      .forUpdate('reminders')
      .skipLocked()
      .executeTakeFirst();
    if (!r) return 'skipped';
    const finish = async (status: 'sent' | 'failed', detail: Record<string, unknown>) => {
      await scoped(trx, { spaceId: r.space_id })
        .updateTable('reminders')
        .set({ status, sent_at: status === 'sent' ? at : null })
        .where('id', '=', r.id)
        .execute();
      await audit(trx, {
        spaceId: r.space_id,
        actorId: r.sent_by,
        action: status === 'sent' ? 'reminder.sent' : 'reminder.failed',
        targetType: 'loan',
        targetId: r.loanId,
        detail: { kind: r.kind, forDay: r.for_day, to: r.email, ...detail },
      });
      return status;
    };
    // Returned since the reminder was queued: nothing to remind of.
    if (r.status !== 'out') return finish('failed', { why: 'returned before it was sent' });

    const lines = await scoped(trx, { spaceId: r.space_id })
      .selectFrom('loan_lines')
      .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
      .leftJoin('units', 'units.id', 'loan_lines.unit_id')
      .select(['parts.name', 'loan_lines.qty', 'units.code as unitCode'])
      .where('loan_lines.loan_id', '=', r.loanId)
      .orderBy('parts.name')
      .execute();
    const mail = reminderMail({
      to: r.email,
      name: r.name,
      spaceName: r.spaceName,
      kind: r.kind,
      dueAt: r.due_at,
      timeZone: r.time_zone,
      daysLate: daysLate(r.due_at, at, r.time_zone),
      boxName: r.boxName,
      lines,
      loanUrl: `${env().APP_BASE_URL}/loans/${r.loanId}`,
    });
    try {
      await send(mail);
    } catch (err) {
      // A refused address will never work: record it. Anything else (mail down) stays pending.
      if (err instanceof InvalidError) return finish('failed', { why: err.message });
      throw err;
    }
    return finish('sent', { subject: mail.subject });
  });
}
