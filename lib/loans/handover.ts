import 'server-only';
import { sql } from 'kysely';
import { scoped } from '@/db/scoped';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { computeDueAt } from './due';
import { loanSettings } from './settings';

// Bench hand-over (a space's `presence` rule): a member's borrow waits at the bench until a steward hands
// it over, and only then is it a loan with a due date. The hand-over is one guarded update
// (`… where status = 'waiting' returning`), so two stewards pressing the button at once cannot both
// hand it over: the second is told who did.

export type HandOverResult = { id: string; dueAt: Date; handedOverBy: string };

export async function handOver(db: Db, ctx: Ctx, loanId: string): Promise<HandOverResult> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward hands things over at the bench.');
  const settings = await loanSettings(db, ctx.spaceId);
  return db.transaction().execute(async (trx) => {
    const at = now();
    const dueAt = computeDueAt(at, settings);
    const done = await scoped(trx, ctx)
      .updateTable('loans')
      .set({ status: 'out', out_at: at, due_at: dueAt, handed_over_by: ctx.userId, handed_over_at: at })
      .where('id', '=', loanId)
      .where('space_id', '=', ctx.spaceId)
      .where('status', '=', 'waiting')
      // A deposit not yet paid keeps it waiting: nothing is handed over before the money is in.
      .where(sql<boolean>`not exists (select 1 from deposits d where d.space_id = loans.space_id and d.loan_id = loans.id and d.status = 'pending')`)
      .returning(['id', 'borrower_id'])
      .executeTakeFirst();
    if (!done) {
      const loan = await scoped(trx, ctx)
        .selectFrom('loans')
        .leftJoin('users', 'users.id', 'loans.handed_over_by')
        .select(['loans.status', 'users.name as by'])
        .select(sql<boolean>`exists (select 1 from deposits d where d.space_id = loans.space_id and d.loan_id = loans.id and d.status = 'pending')`.as('unpaid'))
        .where('loans.id', '=', loanId)
        .where('loans.space_id', '=', ctx.spaceId)
        .executeTakeFirst();
      if (!loan) throw new NotFoundError('No such loan.');
      if (loan.unpaid)
        throw new ConflictError('The deposit is not paid yet: it is handed over once the deposit is in.', {
          loanId: ['deposit not paid'],
        });
      throw new ConflictError(
        loan.by ? `Already handed over by ${loan.by}.` : 'This loan is not waiting at the bench.',
        { loanId: [loan.by ? 'already handed over' : loan.status] },
      );
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'loan.handed_over',
      targetType: 'loan',
      targetId: loanId,
      detail: { borrowerId: done.borrower_id, dueAt: dueAt.toISOString() },
    });
    return { id: loanId, dueAt, handedOverBy: ctx.name };
  });
}

/**
 * A member says what they borrowed is back, in a space with bench hand-over: the loan is back, not yet
 * checked, and nothing returns to the shelf until a steward confirms what came back.
 */
export async function reportBack(trx: Db, ctx: Ctx, loan: { id: string; borrower_id: string }, note?: string) {
  const at = now();
  await scoped(trx, ctx)
    .updateTable('loans')
    .set({ status: 'back_unchecked', back_reported_at: at, back_note: note ?? null })
    .where('id', '=', loan.id)
    .execute();
  await audit(trx, {
    spaceId: ctx.spaceId,
    actorId: ctx.userId,
    action: 'loan.back_reported',
    targetType: 'loan',
    targetId: loan.id,
    detail: note ? { note } : {},
  });
}
