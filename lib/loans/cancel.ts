import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { fixRelease, sendRelease } from '@/lib/deposits/release';
import { log } from '@/lib/log';
import { releaseItem } from './holds';
import { lockOpenLoan } from './lock';

// Giving up a borrow that never became a loan (still `waiting`: at the bench, or for its deposit): the
// member changed their mind, the deposit's pay page expired, or the processor could not open it. What
// was kept for them goes back — a box and its units, loose units, counted parts into their bins — each
// with its movement, and the loan ends `cancelled`. A deposit not yet paid ends; one already paid is
// given back in full (lib/deposits/release.ts).

export type GiveUp = { readyHoldIds: string[]; depositToSend: string | null; sessionToExpire: string | null };

/** In the caller's transaction, on a loan it has locked and found `waiting`. */
export async function giveUpWaitingLoan(
  trx: Db,
  spaceId: string,
  loan: { id: string; kit_box_id: string | null },
  actorId: string | null,
  why: string,
): Promise<GiveUp> {
  const at = now();
  const lines = await scoped(trx, { spaceId })
    .selectFrom('loan_lines')
    .select(['part_id', 'unit_id', 'location_id', 'qty'])
    .where('loan_id', '=', loan.id)
    .orderBy('part_id')
    .orderBy('location_id')
    .execute();
  const readyHoldIds: string[] = [];
  const moves = [];
  if (loan.kit_box_id) {
    await scoped(trx, { spaceId }).updateTable('units').set({ state: 'on_shelf', updated_at: at }).where('kit_box_id', '=', loan.kit_box_id).execute();
    const ready = await releaseItem(trx, spaceId, { kitBoxId: loan.kit_box_id });
    if (ready) readyHoldIds.push(ready);
  }
  for (const l of lines) {
    if (l.unit_id && !loan.kit_box_id) {
      const ready = await releaseItem(trx, spaceId, { unitId: l.unit_id });
      if (ready) readyHoldIds.push(ready);
    }
    if (l.location_id && !l.unit_id)
      await scoped(trx, { spaceId })
        .insertInto('stock')
        .values({ space_id: spaceId, part_id: l.part_id, location_id: l.location_id, qty: l.qty, updated_at: at })
        .onConflict((oc) =>
          oc.columns(['part_id', 'location_id']).doUpdateSet((eb) => ({ qty: eb('stock.qty', '+', l.qty), updated_at: at })),
        )
        .execute();
    if (l.unit_id || l.location_id)
      moves.push({
        space_id: spaceId,
        part_id: l.part_id,
        location_id: l.location_id,
        unit_id: l.unit_id,
        qty_delta: l.unit_id ? 0 : l.qty,
        reason: 'loan_return' as const,
        ref_type: 'loan',
        ref_id: loan.id,
        note: why,
        actor_id: actorId,
        created_at: at,
      });
  }
  if (moves.length) await scoped(trx, { spaceId }).insertInto('stock_movements').values(moves).execute();
  await scoped(trx, { spaceId }).updateTable('loans').set({ status: 'cancelled', cancelled_at: at }).where('id', '=', loan.id).execute();

  // The deposit: not yet paid → ended (its pay page is closed after the commit); paid → all of it back.
  const ended = await scoped(trx, { spaceId })
    .updateTable('deposits')
    .set({ status: 'ended', ended_at: at })
    .where('loan_id', '=', loan.id)
    .where('status', '=', 'pending')
    .returning('checkout_session_id')
    .executeTakeFirst();
  const release = ended ? null : await fixRelease(trx, spaceId, loan.id, 0, actorId);
  await audit(trx, {
    spaceId,
    actorId,
    action: 'loan.cancelled',
    targetType: 'loan',
    targetId: loan.id,
    detail: { why, deposit: ended ? 'not paid; ended' : release ? 'given back in full' : 'none' },
  });
  return {
    readyHoldIds,
    depositToSend: release?.toSend ? release.depositId : null,
    sessionToExpire: ended?.checkout_session_id ?? null,
  };
}

/** The processor's side of a give-up, after the commit: close the pay page, or send the deposit back. */
export async function finishGiveUp(db: Db, stripe: Stripe | null, spaceId: string, g: GiveUp): Promise<void> {
  if (!stripe) return;
  if (g.depositToSend) await sendRelease(db, stripe, spaceId, g.depositToSend);
  if (g.sessionToExpire)
    await stripe.checkout.sessions.expire(g.sessionToExpire).catch((err: unknown) => {
      // Already paid or expired: the webhook of that outcome decides (a late payment is given back).
      log.info({ session: g.sessionToExpire, err: err instanceof Error ? err.message : String(err) }, 'deposit pay page not expired');
    });
}

/** A member gives up their own borrow while it waits (a steward may do it for anyone). */
export async function cancelBorrow(db: Db, ctx: Ctx, loanId: string): Promise<GiveUp> {
  return db.transaction().execute(async (trx) => {
    const loan = await lockOpenLoan(trx, ctx, loanId, 'Only a borrow still waiting can be given up.', ['waiting']);
    return giveUpWaitingLoan(
      trx,
      ctx.spaceId,
      loan,
      ctx.userId,
      loan.borrower_id === ctx.userId ? 'given up by the borrower' : `given up by ${ctx.name}`,
    );
  });
}
