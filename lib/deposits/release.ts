import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ConflictError, ForbiddenError, NotFoundError, UnavailableError } from '@/lib/errors';
import { now } from '@/lib/clock';
import { log } from '@/lib/log';
import { depositReleaseKey, splitDeposit } from './checkout';

// Giving a deposit back, exactly once. In the transaction that confirms the return (or gives up the
// borrow) the amounts are fixed by one guarded update `held → releasing` (what is kept for charges, what
// goes back); a second steward, a double click or a duplicate webhook finds it no longer `held` and does
// nothing. After the commit one refund is asked of the processor with the deposit's own idempotency key,
// so a retry (here, or by the webhook's follow-up) is the same refund, never a second one. The refund
// is booked `releasing → released` by whichever of the answer and the `refund.created` event comes first.

export type FixedRelease = { depositId: string; keptMinor: number; releasedMinor: number; toSend: boolean };

/** The loan's held deposit: fix what is kept and what goes back. Null when there is none to release. */
export async function fixRelease(
  trx: Db,
  spaceId: string,
  loanId: string,
  chargedMinor: number,
  actorId: string | null,
): Promise<FixedRelease | null> {
  const d = await scoped(trx, { spaceId })
    .selectFrom('deposits')
    .select(['id', 'amount_minor', 'currency', 'status'])
    .where('loan_id', '=', loanId)
    .forUpdate()
    .executeTakeFirst();
  if (!d || d.status !== 'held') return null;
  const { keptMinor, releasedMinor } = splitDeposit(d.amount_minor, chargedMinor);
  const at = now();
  const fixed = await scoped(trx, { spaceId })
    .updateTable('deposits')
    .set({
      status: releasedMinor > 0 ? 'releasing' : 'released',
      kept_minor: keptMinor,
      released_minor: releasedMinor,
      release_started_at: at,
      released_at: releasedMinor > 0 ? null : at,
    })
    .where('id', '=', d.id)
    .where('status', '=', 'held')
    .returning('id')
    .executeTakeFirst();
  if (!fixed) return null;
  await audit(trx, {
    spaceId,
    actorId,
    action: 'deposit.release_fixed',
    targetType: 'loan',
    targetId: loanId,
    detail: { depositId: d.id, amountMinor: d.amount_minor, keptMinor, releasedMinor, currency: d.currency },
  });
  return { depositId: d.id, keptMinor, releasedMinor, toSend: releasedMinor > 0 };
}

/** Marks the refund booked; false when it already was (the other path got there first). */
export async function bookRelease(
  trx: Db,
  spaceId: string,
  depositId: string,
  refundId: string,
  source: string,
): Promise<boolean> {
  const done = await scoped(trx, { spaceId })
    .updateTable('deposits')
    .set({ status: 'released', refund_id: refundId, released_at: now() })
    .where('id', '=', depositId)
    .where('status', '=', 'releasing')
    .returning(['loan_id', 'released_minor', 'currency'])
    .executeTakeFirst();
  if (!done) return false;
  await audit(trx, {
    spaceId,
    actorId: null,
    action: 'deposit.released',
    targetType: 'loan',
    targetId: done.loan_id,
    detail: { depositId, refundId, releasedMinor: done.released_minor, currency: done.currency, source },
  });
  return true;
}

/**
 * After the commit: the one refund of what goes back. Safe to call any number of times: the processor
 * answers a repeated key with the first refund. A failure leaves the deposit `releasing` for the next try.
 */
export async function sendRelease(db: Db, stripe: Stripe, spaceId: string, depositId: string): Promise<boolean> {
  const d = await scoped(db, { spaceId })
    .selectFrom('deposits')
    .select(['id', 'loan_id', 'status', 'payment_intent_id', 'released_minor'])
    .where('id', '=', depositId)
    .executeTakeFirst();
  if (!d || d.status !== 'releasing' || !d.payment_intent_id || !d.released_minor) return false;
  try {
    const refund = await stripe.refunds.create(
      {
        payment_intent: d.payment_intent_id,
        amount: d.released_minor,
        metadata: { depositId: d.id, loanId: d.loan_id, spaceId },
      },
      { idempotencyKey: depositReleaseKey(d.id) },
    );
    return db.transaction().execute((trx) => bookRelease(trx, spaceId, d.id, refund.id, 'refund answer'));
  } catch (err) {
    log.error({ depositId, err: err instanceof Error ? err.message : String(err) }, 'deposit release failed; it stays releasing');
    return false;
  }
}

/**
 * A steward's "send it again" for a deposit left `releasing` (the processor did not answer): the same
 * refund, with the same key, so it can never be two.
 */
export async function retryRelease(db: Db, ctx: Ctx, loanId: string, stripe: Stripe): Promise<{ released: boolean }> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward sends a deposit back.');
  const d = await scoped(db, ctx)
    .selectFrom('deposits')
    .innerJoin('loans', 'loans.id', 'deposits.loan_id')
    .select(['deposits.id', 'deposits.status'])
    .where('deposits.loan_id', '=', loanId)
    .executeTakeFirst();
  if (!d) {
    const loan = await scoped(db, ctx).selectFrom('loans').select('id').where('id', '=', loanId).executeTakeFirst();
    if (!loan) throw new NotFoundError('No such loan.');
    throw new ConflictError('This loan has no deposit.', { loanId: ['no deposit'] });
  }
  if (d.status !== 'releasing')
    throw new ConflictError(
      d.status === 'released' ? 'The deposit is settled already.' : 'Nothing of this deposit is waiting to go back.',
      { loanId: [`deposit ${d.status}`] },
    );
  const released = await sendRelease(db, stripe, ctx.spaceId, d.id);
  // Not booked by us: perhaps the refund's event (or a second steward) booked it a moment earlier.
  const now = released
    ? 'released'
    : (await scoped(db, ctx).selectFrom('deposits').select('status').where('id', '=', d.id).executeTakeFirstOrThrow()).status;
  if (now !== 'released')
    throw new UnavailableError('The card processor did not take the refund; the deposit still waits to go back. Try again shortly.');
  return { released: true };
}
