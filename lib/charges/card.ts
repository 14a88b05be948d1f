import 'server-only';
import type Stripe from 'stripe';
import { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ConflictError, ForbiddenError, NotFoundError, UnavailableError } from '@/lib/errors';
import { log } from '@/lib/log';
import { now } from '@/lib/clock';
import { formatMoney } from '@/lib/money';
import { moneyRules } from '@/lib/money-rules/settings';
import { CHECKOUT_TTL_SECONDS } from '@/lib/sales/checkout';
import { processorError } from '@/lib/sales/processor-errors';
import { spaceClock } from '@/lib/sales/periods';
import { lockOpenCharges } from './apply';

// Paying what one owes by card, on the same processor path as a counter sale: a payment row is written
// (pending) for exactly what is owed, then one checkout session is opened for it with an idempotency key
// from the row's id, and only the signed webhook about *that* session (its id stored on the row), for
// that amount and currency, settles the charges (lib/charges/card-events.ts). A member pays their own
// charges; a steward opens the pay page for a member at the bench. One open pay page per member: a
// second press answers the same page; if what is owed changed meanwhile, the old page is closed first.

export const payByCardSchema = z
  .object({
    /** The loan page to come back to after paying (one of this person's loans); otherwise their loans. */
    loanId: z.uuid('loanId must be a loan id').optional(),
  })
  .strict();

export type CardPaymentDeps = { stripe: Stripe; appBaseUrl: string };
export type OpenedCardPayment = { paymentId: string; amountMinor: number; currency: string; url: string };

export const chargePaymentCheckoutKey = (paymentId: string) => `ohm-charge-payment-${paymentId}-checkout`;

type Row = { id: string; amount_minor: number; currency: string; created_at: Date; checkout_url: string | null };

export async function startCardPayment(
  db: Db,
  ctx: Ctx,
  userId: string,
  input: z.infer<typeof payByCardSchema>,
  deps: CardPaymentDeps,
): Promise<OpenedCardPayment> {
  const { row, toExpire, back, email } = await db.transaction().execute(async (trx) => {
    const member = await scoped(trx, ctx)
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select(['memberships.user_id', 'users.email'])
      .where('memberships.user_id', '=', userId)
      .executeTakeFirst();
    if (!member) throw new NotFoundError('No such person in this space.');
    if (!isStaff(ctx) && userId !== ctx.userId) throw new ForbiddenError('A member pays only their own charges.');
    const { currency } = await spaceClock(trx, ctx.spaceId);
    // The charges' lock also serialises two presses for the same member.
    const owed = (await lockOpenCharges(trx, ctx.spaceId, userId)).reduce((s, c) => s + c.owedMinor, 0);
    if (owed === 0) throw new ConflictError('Nothing is owed, so there is nothing to pay.', { id: ['owes nothing'] });
    const { minCardMinor } = await moneyRules(trx, ctx.spaceId);
    if (owed < minCardMinor)
      throw new ConflictError(
        `${formatMoney(owed, currency)} is below the smallest card payment here (${formatMoney(minCardMinor, currency)}): pay it in cash at the bench.`,
        { id: [`below the card minimum of ${minCardMinor}`] },
      );
    const open = await scoped(trx, ctx)
      .selectFrom('charge_payments')
      .select(['id', 'amount_minor', 'currency', 'created_at', 'checkout_url', 'checkout_session_id'])
      .where('user_id', '=', userId)
      .where('status', '=', 'pending')
      .forUpdate()
      .executeTakeFirst();
    let toExpire: string | null = null;
    let row: Row | undefined = open && open.amount_minor === owed ? open : undefined;
    if (open && !row) {
      // What is owed changed since that page was opened: close it; a payment on it still counts (card-events.ts).
      await scoped(trx, ctx).updateTable('charge_payments').set({ status: 'ended', ended_at: now() }).where('id', '=', open.id).execute();
      toExpire = open.checkout_session_id;
    }
    if (!row) {
      row = await scoped(trx, ctx)
        .insertInto('charge_payments')
        .values({ space_id: ctx.spaceId, user_id: userId, method: 'card', amount_minor: owed, currency, created_by: ctx.userId })
        .returning(['id', 'amount_minor', 'currency', 'created_at', 'checkout_url'])
        .executeTakeFirstOrThrow();
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: 'charge.card_payment_started',
        targetType: 'user',
        targetId: userId,
        detail: { paymentId: row.id, amountMinor: owed, currency },
      });
    }
    const loan = input.loanId
      ? await scoped(trx, ctx).selectFrom('loans').select('id').where('id', '=', input.loanId).where('borrower_id', '=', userId).executeTakeFirst()
      : undefined;
    return { row, toExpire, back: loan ? `/loans/${loan.id}` : '/loans', email: member.email };
  });
  if (toExpire)
    await deps.stripe.checkout.sessions.expire(toExpire).catch((err: unknown) => {
      log.info({ session: toExpire, err: err instanceof Error ? err.message : String(err) }, 'old charge pay page not closed');
    });
  const due = { paymentId: row.id, amountMinor: row.amount_minor, currency: row.currency };
  if (row.checkout_url) return { ...due, url: row.checkout_url };
  return { ...due, url: await openCheckout(db, ctx, userId, row, back, email, deps) };
}

async function openCheckout(db: Db, ctx: Ctx, userId: string, row: Row, back: string, email: string, deps: CardPaymentDeps): Promise<string> {
  const base = deps.appBaseUrl.replace(/\/$/, '');
  const metadata = { chargePaymentId: row.id, userId, spaceId: ctx.spaceId };
  let session: Stripe.Checkout.Session;
  try {
    session = await deps.stripe.checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [
          {
            price_data: {
              currency: row.currency.toLowerCase(),
              unit_amount: row.amount_minor,
              product_data: { name: `Charges owed at ${ctx.spaceName}`.slice(0, 250) },
            },
            quantity: 1,
          },
        ],
        success_url: `${base}${back}?charges=paid`,
        cancel_url: `${base}${back}?charges=cancelled`,
        client_reference_id: row.id,
        metadata,
        payment_intent_data: { description: `${ctx.spaceName}: charges owed`.slice(0, 1000), metadata },
        customer_email: email,
        // From the row's own time, so a retried call sends the same parameters under the same key.
        expires_at: Math.floor(row.created_at.getTime() / 1000) + CHECKOUT_TTL_SECONDS,
      },
      { idempotencyKey: chargePaymentCheckoutKey(row.id) },
    );
    if (!session.url) throw new UnavailableError('The card processor opened no payment page.');
  } catch (err) {
    // Nothing was charged: the row ends, so the next press opens a fresh page.
    await scoped(db, ctx)
      .updateTable('charge_payments')
      .set({ status: 'ended', ended_at: now() })
      .where('id', '=', row.id)
      .where('status', '=', 'pending')
      .where('checkout_session_id', 'is', null)
      .execute();
    throw processorError(err, 'open the payment page for the charges');
  }
  await db.transaction().execute(async (trx) => {
    await scoped(trx, ctx)
      .updateTable('charge_payments')
      .set({ checkout_session_id: session.id, checkout_url: session.url })
      .where('id', '=', row.id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'charge.checkout_opened',
      targetType: 'user',
      targetId: userId,
      detail: { paymentId: row.id, session: session.id, amountMinor: row.amount_minor, currency: row.currency },
    });
  });
  return session.url!;
}
