import 'server-only';
import { builtOnce } from '@/db/built-once';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { LoanStatus } from '@/db/types';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ConflictError, NotFoundError } from '@/lib/errors';

// Shared steps of the services that change a loan or count a borrower's loans.

/**
 * Locks a loan that is still out, for a change by its borrower or a steward. Someone else's loan, or
 * another space's, answers as if it did not exist.
 */
export async function lockOpenLoan(
  trx: Db,
  ctx: Ctx,
  loanId: string,
  notOut: string,
  allowed: LoanStatus[] = ['out'],
) {
  const loan = await scoped(trx, ctx)
    .selectFrom('loans')
    .select(['id', 'borrower_id', 'status', 'kit_box_id', 'due_at', 'renewals'])
    .where('id', '=', loanId)
    .where('space_id', '=', ctx.spaceId)
    .forUpdate()
    .executeTakeFirst();
  if (!loan || (loan.borrower_id !== ctx.userId && !isStaff(ctx))) throw new NotFoundError('No such loan.');
  if (!allowed.includes(loan.status)) {
    const why =
      loan.status === 'waiting'
        ? 'This is still waiting at the bench: a steward hands it over first.'
        : loan.status === 'back_unchecked'
          ? 'This is back already; a steward checks it and confirms what came back.'
          : notOut;
    throw new ConflictError(why, { loanId: [loan.status] });
  }
  return loan;
}

// Built once per process (db/built-once.ts): every borrow and every borrow preview counts.
const openLoans = builtOnce('open_loan_count', (db, spaceId: string, borrowerId: string) =>
  scoped(db, { spaceId })
    .selectFrom('loans')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('space_id', '=', spaceId)
    .where('borrower_id', '=', borrowerId)
    // Waiting at the bench and back-but-unchecked still hold the member's place under the limit.
    .where('status', 'in', ['waiting', 'out', 'back_unchecked']),
);

export async function openLoanCount(db: Db, spaceId: string, borrowerId: string): Promise<number> {
  const [open] = await openLoans(db, spaceId, borrowerId);
  return open.n;
}

export const limitReached = (max: number) => `The limit of ${max} open loans is reached; return one first.`;
