import 'server-only';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { borrow, type BorrowResult } from '@/lib/loans/borrow';
import { finishGiveUp, giveUpWaitingLoan } from '@/lib/loans/cancel';
import { lockOpenLoan } from '@/lib/loans/lock';
import type { BorrowInput } from '@/lib/loans/schemas';
import { openDepositCheckout, type DepositDeps, type OpenedDeposit } from './take';

export type BorrowAnswer = Omit<BorrowResult, 'deposit'> & { deposit: OpenedDeposit | null };

/**
 * A borrow, and when its kit asks for a deposit, the pay page for it (opened after the borrow's commit).
 * If the processor cannot open one, the borrow is given up before the error goes back.
 */
export async function borrowWithDeposit(
  db: Db,
  ctx: Ctx,
  input: BorrowInput,
  deps: () => DepositDeps,
): Promise<BorrowAnswer> {
  const loan = await borrow(db, ctx, input);
  if (!loan.deposit) return { ...loan, deposit: null };
  const d = deps();
  const deposit = await openDepositCheckout(db, ctx, loan.id, d, async (reason) => {
    const g = await db.transaction().execute(async (trx) => {
      const locked = await lockOpenLoan(trx, ctx, loan.id, 'no longer waiting', ['waiting']);
      return giveUpWaitingLoan(trx, ctx.spaceId, locked, ctx.userId, `the deposit's pay page could not be opened: ${reason}`.slice(0, 500));
    });
    await finishGiveUp(db, null, ctx.spaceId, g);
  });
  return { ...loan, deposit };
}
