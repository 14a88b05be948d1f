import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { AppError, UnavailableError } from '@/lib/errors';
import { isProcessorUnreachable, processorError } from '@/lib/sales/processor-errors';
import { spaceClock } from '@/lib/sales/periods';
import { depositCheckoutKey, depositCheckoutParams } from './checkout';

// Taking a deposit. A borrow of a box whose kit asks for one writes the loan as `waiting` with a
// `pending` deposit in the same transaction (lib/loans/borrow.ts); then, after the commit, one call to the
// processor opens the pay page (idempotency key from the deposit's id). Nothing is a loan until the
// signed webhook says the deposit was paid (lib/deposits/events.ts). If the processor cannot be reached
// the borrow is given up at once (its items go back) and the caller gets a 503.

export type DepositDue = { id: string; amountMinor: number; currency: string };
export type DepositDeps = { stripe: Stripe; appBaseUrl: string };

/** The deposit a kit template asks for, in minor units, or null. */
export async function templateDeposit(trx: Db, spaceId: string, templateId: string | null): Promise<number | null> {
  if (!templateId) return null;
  const t = await scoped(trx, { spaceId })
    .selectFrom('kit_templates')
    .select('deposit_minor')
    .where('id', '=', templateId)
    .executeTakeFirst();
  return t?.deposit_minor ?? null;
}

/**
 * The deposit a loose borrow asks for: the space's amount for each part category in it, once per
 * category, summed (rules.categoryDepositsMinor); null when none applies.
 */
export function categoryDeposit(amounts: Partial<Record<string, number>>, categories: string[]): number | null {
  const total = [...new Set(categories)].reduce((sum, c) => sum + (amounts[c] ?? 0), 0);
  return total > 0 ? total : null;
}

/** In the borrow's transaction: the loan's deposit, pending until paid. */
export async function recordDeposit(
  trx: Db,
  ctx: Ctx,
  loan: { id: string; amountMinor: number; startsAs: 'out' | 'waiting' },
): Promise<DepositDue> {
  const { currency } = await spaceClock(trx, ctx.spaceId);
  const row = await scoped(trx, ctx)
    .insertInto('deposits')
    .values({
      space_id: ctx.spaceId,
      loan_id: loan.id,
      amount_minor: loan.amountMinor,
      currency,
      starts_as: loan.startsAs,
    })
    .returning(['id', 'amount_minor', 'currency'])
    .executeTakeFirstOrThrow();
  return { id: row.id, amountMinor: row.amount_minor, currency: row.currency };
}

export type OpenedDeposit = DepositDue & { url: string };

/** After the borrow's commit: the pay page for the deposit. */
export async function openDepositCheckout(
  db: Db,
  ctx: Ctx,
  loanId: string,
  deps: DepositDeps,
  giveUp: (reason: string) => Promise<void>,
): Promise<OpenedDeposit> {
  const d = await scoped(db, ctx)
    .selectFrom('deposits')
    .innerJoin('loans', 'loans.id', 'deposits.loan_id')
    .innerJoin('users', 'users.id', 'loans.borrower_id')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select([
      'deposits.id',
      'deposits.amount_minor',
      'deposits.currency',
      'deposits.checkout_url',
      'users.email',
      'kit_boxes.name as box',
    ])
    .where('deposits.loan_id', '=', loanId)
    .executeTakeFirstOrThrow();
  const due = { id: d.id, amountMinor: d.amount_minor, currency: d.currency };
  if (d.checkout_url) return { ...due, url: d.checkout_url };
  let session: Stripe.Checkout.Session;
  try {
    session = await deps.stripe.checkout.sessions.create(
      depositCheckoutParams({
        depositId: d.id,
        loanId,
        spaceId: ctx.spaceId,
        amountMinor: d.amount_minor,
        currency: d.currency,
        itemName: d.box ?? 'parts',
        appBaseUrl: deps.appBaseUrl,
        borrowerEmail: d.email,
        description: `${ctx.spaceName} deposit for ${d.box ?? 'borrowed parts'}`,
        nowSeconds: Math.floor(Date.now() / 1000),
      }),
      { idempotencyKey: depositCheckoutKey(d.id) },
    );
    if (!session.url) throw new UnavailableError('The card processor opened no payment page.');
  } catch (err) {
    await giveUp(err instanceof Error ? err.message : String(err));
    if (isProcessorUnreachable(err))
      throw new UnavailableError(
        'The card processor is not answering, so the deposit cannot be taken. Nothing was charged and everything is back on the shelf; try again in a minute.',
      );
    throw err instanceof AppError ? err : processorError(err, 'open the deposit payment');
  }
  await db.transaction().execute(async (trx) => {
    await scoped(trx, ctx)
      .updateTable('deposits')
      .set({ checkout_session_id: session.id, checkout_url: session.url })
      .where('id', '=', d.id)
      .where('status', '=', 'pending')
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'deposit.checkout_opened',
      targetType: 'loan',
      targetId: loanId,
      detail: { depositId: d.id, session: session.id, amountMinor: d.amount_minor, currency: d.currency },
    });
  });
  return { ...due, url: session.url };
}
