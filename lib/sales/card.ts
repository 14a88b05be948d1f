import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { AppError, ConflictError, UnavailableError } from '@/lib/errors';
import { saleFor, resolveBuyer } from './access';
import { basketTotal, priceBasket } from './basket';
import { checkoutIdempotencyKey, checkoutParams } from './checkout';
import { markSaleEnded } from './paid';
import { spaceClock } from './periods';
import { saleRef } from './ref';
import { isProcessorUnreachable, processorError } from './processor-errors';
import type { StartSaleInput } from './schemas';
import { settleSale, type Settled } from './settle';
import { taxSale, taxWords } from './tax';
import { moneyRules, taxRuleOf } from '@/lib/money-rules/settings';
import { formatMoney } from '@/lib/money';

/**
 * The space's smallest card payment: a card sale below it is refused before anything is written (a
 * sale of 0.30 can cost more than 0.30 in processor fees). The counter offers cash only below it and
 * says so; this is the same rule on the server.
 */
export function refuseBelowCardMinimum(totalMinor: number, minCardMinor: number, currency: string): void {
  if (minCardMinor > 0 && totalMinor < minCardMinor)
    throw new ConflictError(
      `Card payments start at ${formatMoney(minCardMinor, currency)} here: on a smaller sale the card fees eat most of the money. Pay ${formatMoney(totalMinor, currency)} in cash into the honour box instead.`,
      { lines: [`The total ${formatMoney(totalMinor, currency)} is below the card minimum of ${formatMoney(minCardMinor, currency)}.`] },
    );
}

export type PaymentsDeps = { stripe: Stripe; appBaseUrl: string };

export type StartedSale = {
  saleId: string;
  url: string;
  totalMinor: number;
  currency: string;
  expiresAt: Date;
};

/**
 * A card sale in two steps around one call to the processor. First the sale and its lines are
 * written as `pending` (prices from the database). Then the processor opens a checkout session; its
 * idempotency key is derived from the sale id, so a retried call can never open a second session.
 * Nothing leaves the shelf here: stock moves when the signed webhook says the money arrived. If the
 * processor cannot be reached the sale is marked `failed` at once (never left pending) and the caller
 * gets a 503.
 */
export async function startCardSale(
  db: Db,
  ctx: Ctx,
  input: StartSaleInput,
  deps: PaymentsDeps,
): Promise<StartedSale> {
  const buyerId = await resolveBuyer(db, ctx, input.buyerId);
  const { sale, lines, taxLine } = await db.transaction().execute(async (trx) => {
    const { currency } = await spaceClock(trx, ctx.spaceId);
    const rules = await moneyRules(trx, ctx.spaceId);
    const rule = taxRuleOf(rules);
    const priced = await priceBasket(trx, ctx.spaceId, input.lines);
    const taxed = taxSale(basketTotal(priced), rule);
    refuseBelowCardMinimum(taxed.totalMinor, rules.minCardMinor, currency);
    const row = await scoped(trx, ctx)
      .insertInto('sales')
      .values({
        space_id: ctx.spaceId,
        buyer_id: buyerId,
        cashier_id: ctx.userId,
        method: 'card',
        status: 'pending',
        currency,
        total_minor: taxed.totalMinor,
        tax_mode: rule.mode,
        tax_rate_bp: rule.rateBp,
        tax_minor: taxed.taxMinor,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await scoped(trx, ctx)
      .insertInto('sale_lines')
      .values(
        priced.map((l) => ({
          sale_id: row.id,
          space_id: ctx.spaceId,
          part_id: l.partId,
          qty: l.qty,
          unit_price_minor: l.unitPriceMinor,
        })),
      )
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'sale.started',
      targetType: 'sale',
      targetId: row.id,
      detail: { method: 'card', totalMinor: row.total_minor, taxMinor: row.tax_minor, buyerId },
    });
    // Tax added to shelf prices is its own line on the pay page, so the processor charges what we hold.
    const taxLine =
      rule.mode === 'exclusive' && taxed.taxMinor > 0
        ? { name: taxWords(rules.taxName, rule), qty: 1, unitPriceMinor: taxed.taxMinor }
        : null;
    return { sale: row, lines: priced, taxLine };
  });

  const buyer = await db.selectFrom('users').select('email').where('id', '=', buyerId).executeTakeFirst();
  let session: Stripe.Checkout.Session;
  try {
    session = await deps.stripe.checkout.sessions.create(
      checkoutParams({
        saleId: sale.id,
        spaceId: ctx.spaceId,
        currency: sale.currency,
        lines: [
          ...lines.map((l) => ({ name: l.name, qty: l.qty, unitPriceMinor: l.unitPriceMinor, saleUnit: l.saleUnit })),
          ...(taxLine ? [taxLine] : []),
        ],
        appBaseUrl: deps.appBaseUrl,
        buyerEmail: buyer?.email,
        description: `${ctx.spaceName} counter sale ${saleRef(sale.id)}`,
        nowSeconds: Math.floor(Date.now() / 1000),
      }),
      { idempotencyKey: checkoutIdempotencyKey(sale.id) },
    );
    if (!session.url) throw new UnavailableError('The card processor opened no payment page.');
  } catch (err) {
    await db.transaction().execute((trx) =>
      markSaleEnded(trx, sale.id, 'failed', {
        source: 'checkout',
        actorId: ctx.userId,
        reason: err instanceof Error ? err.message : String(err),
      }),
    );
    if (isProcessorUnreachable(err)) {
      throw new UnavailableError(
        'The card processor is not answering. Nothing was charged and nothing left the shelf; try again in a minute, or pay cash to a steward.',
      );
    }
    throw err instanceof AppError ? err : processorError(err, 'open the card payment');
  }

  const expiresAt = new Date(session.expires_at * 1000);
  await db.transaction().execute(async (trx) => {
    await scoped(trx, ctx)
      .updateTable('sales')
      .set({ checkout_session_id: session.id, expires_at: expiresAt })
      .where('id', '=', sale.id)
      .where('status', '=', 'pending')
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'sale.checkout_opened',
      targetType: 'sale',
      targetId: sale.id,
      detail: { session: session.id },
    });
  });
  return {
    saleId: sale.id,
    url: session.url,
    totalMinor: sale.total_minor,
    currency: sale.currency,
    expiresAt,
  };
}

/**
 * "Cancel" on the pay page: the session is expired at the processor and the sale ends `expired`,
 * unless the processor says it was paid after all (then it becomes paid, as the webhook would).
 */
export async function cancelCardSale(db: Db, ctx: Ctx, saleId: string, stripe: Stripe): Promise<Settled> {
  const sale = await saleFor(db, ctx, saleId);
  if (sale.status !== 'pending' || sale.method !== 'card') return { saleId, status: sale.status };
  return settleSale(db, stripe, sale, {
    expireOpen: true,
    actorId: ctx.userId,
    source: 'cancelled at the counter',
  });
}
