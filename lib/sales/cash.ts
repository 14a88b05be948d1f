import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError } from '@/lib/errors';
import { resolveBuyer } from './access';
import { basketTotal, priceBasket, type PricedLine } from './basket';
import { isClosedAt, spaceClock } from './periods';
import type { StartSaleInput } from './schemas';
import { takeStock } from './stock';
import { EXEMPT, taxSale, type TaxRule } from './tax';
import { moneyRules, taxRuleOf } from '@/lib/money-rules/settings';

/** Writes a sale paid at once in cash and moves its stock; refuses (rolls back) if the shelf is short. */
export async function writeCashSale(
  trx: Db,
  input: {
    spaceId: string;
    currency: string;
    buyerId: string;
    cashierId: string;
    lines: PricedLine[];
    at: Date;
    /** The space's tax rule when the sale is made (kept on the sale); none given: exempt. */
    tax?: TaxRule;
    /** Rung up at the counter (a steward), or recorded at the honour box by the buyer themself. */
    channel?: 'counter' | 'honour_box';
  },
): Promise<{ id: string; total_minor: number; tax_minor: number }> {
  const rule = input.tax ?? EXEMPT;
  const taxed = taxSale(basketTotal(input.lines), rule);
  const sale = await scoped(trx, { spaceId: input.spaceId })
    .insertInto('sales')
    .values({
      space_id: input.spaceId,
      buyer_id: input.buyerId,
      cashier_id: input.cashierId,
      method: 'cash',
      status: 'paid',
      currency: input.currency,
      total_minor: taxed.totalMinor,
      tax_mode: rule.mode,
      tax_rate_bp: rule.rateBp,
      tax_minor: taxed.taxMinor,
      channel: input.channel ?? 'counter',
      created_at: input.at,
      paid_at: input.at,
    })
    .returning(['id', 'total_minor', 'tax_minor'])
    .executeTakeFirstOrThrow();
  const lines = await scoped(trx, { spaceId: input.spaceId })
    .insertInto('sale_lines')
    .values(
      input.lines.map((l) => ({
        sale_id: sale.id,
        space_id: input.spaceId,
        part_id: l.partId,
        qty: l.qty,
        unit_price_minor: l.unitPriceMinor,
      })),
    )
    .returning(['id', 'part_id', 'qty'])
    .execute();
  const short = await takeStock(trx, {
    spaceId: input.spaceId,
    saleId: sale.id,
    actorId: input.cashierId,
    lines,
    allowShort: false,
    at: input.at,
  });
  if (short.length) {
    const line = input.lines.findIndex((l) => l.partId === short[0].partId);
    throw new ConflictError('Not enough on the shelf for this basket.', {
      [`lines.${line}.qty`]: [`Only ${short[0].taken} on the shelf.`],
    });
  }
  await audit(trx, {
    spaceId: input.spaceId,
    actorId: input.cashierId,
    action: input.channel === 'honour_box' ? 'sale.honour_box' : 'sale.cash',
    targetType: 'sale',
    targetId: sale.id,
    detail: { totalMinor: sale.total_minor, taxMinor: sale.tax_minor, buyerId: input.buyerId },
  });
  return sale;
}

/**
 * Cash into the honour box, paid at once, stock out, one transaction. A steward records it at the
 * counter for any member (`counter`); a member records their own purchase (`honour_box`): the buyer is
 * the member, never the steward on duty, and a member cannot record one for someone else.
 */
export async function recordCashSale(
  db: Db,
  ctx: Ctx,
  input: StartSaleInput,
  channel: 'counter' | 'honour_box' = 'counter',
): Promise<{ saleId: string; totalMinor: number; taxMinor: number; currency: string }> {
  if (channel === 'counter' && !isStaff(ctx)) throw new ForbiddenError('Only a steward records cash sales at the counter.');
  if (channel === 'honour_box' && input.buyerId && input.buyerId !== ctx.userId)
    throw new ForbiddenError('At the honour box you record your own purchase only.');
  const buyerId = channel === 'honour_box' ? ctx.userId : await resolveBuyer(db, ctx, input.buyerId);
  return db.transaction().execute(async (trx) => {
    const at = now();
    if (await isClosedAt(trx, ctx.spaceId, at))
      throw new ConflictError('This month is closed in the books; cash sales cannot be added to it.');
    const { currency } = await spaceClock(trx, ctx.spaceId);
    const tax = taxRuleOf(await moneyRules(trx, ctx.spaceId));
    const lines = await priceBasket(trx, ctx.spaceId, input.lines);
    const sale = await writeCashSale(trx, {
      spaceId: ctx.spaceId,
      currency,
      buyerId,
      cashierId: ctx.userId,
      lines,
      at,
      tax,
      channel,
    });
    return { saleId: sale.id, totalMinor: sale.total_minor, taxMinor: sale.tax_minor, currency };
  });
}
