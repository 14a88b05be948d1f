import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError } from '@/lib/errors';
import { renewedDueAt } from './due';
import { lockOpenLoan } from './lock';
import { loanSettings } from './settings';

// A renewal: another loan period, as often as the space allows (once by default), and only while
// nobody is waiting for the box or any unit on the loan.
export async function renewLoan(
  db: Db,
  ctx: Ctx,
  loanId: string,
): Promise<{ dueAt: Date; renewals: number }> {
  const settings = await loanSettings(db, ctx.spaceId);
  return db.transaction().execute(async (trx) => {
    const loan = await lockOpenLoan(trx, ctx, loanId, 'Only a loan that is out can be renewed.');
    if (loan.renewals >= settings.maxRenewals)
      throw new ConflictError(
        settings.maxRenewals === 1
          ? 'This loan was renewed once already.'
          : `This loan was renewed ${loan.renewals} times, the most allowed.`,
        { loanId: ['no renewals left'] },
      );
    const waiting = await scoped(trx, ctx)
      .selectFrom('holds')
      .select('holds.id')
      .where('holds.space_id', '=', ctx.spaceId)
      .where('holds.status', 'in', ['waiting', 'ready'])
      .where((eb) =>
        eb.or([
          ...(loan.kit_box_id ? [eb('holds.kit_box_id', '=', loan.kit_box_id)] : []),
          eb(
            'holds.unit_id',
            'in',
            eb
              .selectFrom('loan_lines')
              .select('unit_id')
              .where('loan_id', '=', loan.id)
              .where('unit_id', 'is not', null),
          ),
        ]),
      )
      .executeTakeFirst();
    if (waiting)
      throw new ConflictError(
        'Someone is waiting for this; it cannot be renewed. Please bring it back by the due date.',
        { loanId: ['held by someone'] },
      );

    const at = now();
    const dueAt = renewedDueAt(loan.due_at, at, settings);
    await scoped(trx, ctx)
      .updateTable('loans')
      .set({ due_at: dueAt, renewals: loan.renewals + 1 })
      .where('id', '=', loan.id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'loan.renewed',
      targetType: 'loan',
      targetId: loan.id,
      detail: { from: loan.due_at.toISOString(), to: dueAt.toISOString(), renewals: loan.renewals + 1 },
    });
    return { dueAt, renewals: loan.renewals + 1 };
  });
}
