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
  },
): Promise<{ id: string; total_minor: number }> {
  const sale = await scoped(trx, { spaceId: input.spaceId })
    .insertInto('sales')
    .values({
      space_id: input.spaceId,
      buyer_id: input.buyerId,
      cashier_id: input.cashierId,
      method: 'cash',
      status: 'paid',
      currency: input.currency,
      total_minor: basketTotal(input.lines),
      created_at: input.at,
      paid_at: input.at,
    })
    .returning(['id', 'total_minor'])
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
    action: 'sale.cash',
    targetType: 'sale',
    targetId: sale.id,
    detail: { totalMinor: sale.total_minor, buyerId: input.buyerId },
  });
  return sale;
}

/** Cash into the honour box, recorded by a steward: paid at once, stock out, one transaction. */
export async function recordCashSale(
  db: Db,
  ctx: Ctx,
  input: StartSaleInput,
): Promise<{ saleId: string; totalMinor: number; currency: string }> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward records cash sales.');
  const buyerId = await resolveBuyer(db, ctx, input.buyerId);
  return db.transaction().execute(async (trx) => {
    const at = now();
    if (await isClosedAt(trx, ctx.spaceId, at))
      throw new ConflictError('This month is closed in the books; cash sales cannot be added to it.');
    const { currency } = await spaceClock(trx, ctx.spaceId);
    const lines = await priceBasket(trx, ctx.spaceId, input.lines);
    const sale = await writeCashSale(trx, {
      spaceId: ctx.spaceId,
      currency,
      buyerId,
      cashierId: ctx.userId,
      lines,
      at,
    });
    return { saleId: sale.id, totalMinor: sale.total_minor, currency };
  });
}
