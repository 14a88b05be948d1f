import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ConflictError, NotFoundError } from '@/lib/errors';

// Shared steps of the services that change a loan or count a borrower's loans.

/**
 * Locks a loan that is still out, for a change by its borrower or a steward. Someone else's loan, or
 * another space's, answers as if it did not exist.
 */
export async function lockOpenLoan(trx: Db, ctx: Ctx, loanId: string, notOut: string) {
  const loan = await scoped(trx, ctx)
    .selectFrom('loans')
    .select(['id', 'borrower_id', 'status', 'kit_box_id', 'due_at', 'renewals'])
    .where('id', '=', loanId)
    .where('space_id', '=', ctx.spaceId)
    .forUpdate()
    .executeTakeFirst();
  if (!loan || (loan.borrower_id !== ctx.userId && !isStaff(ctx))) throw new NotFoundError('No such loan.');
  if (loan.status !== 'out') throw new ConflictError(notOut, { loanId: [loan.status] });
  return loan;
}

export async function openLoanCount(db: Db, spaceId: string, borrowerId: string): Promise<number> {
  const open = await scoped(db, { spaceId })
    .selectFrom('loans')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('space_id', '=', spaceId)
    .where('borrower_id', '=', borrowerId)
    .where('status', '=', 'out')
    .executeTakeFirstOrThrow();
  return open.n;
}

export const limitReached = (max: number) => `The limit of ${max} open loans is reached; return one first.`;
