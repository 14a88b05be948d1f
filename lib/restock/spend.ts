import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { PartCategory } from '@/db/types';
import type { Ctx } from '@/lib/auth/roles';
import { monthRange, spaceClock, type Month } from '@/lib/sales/periods';
import { purchasesReceived } from './purchases';

// The treasurer's month, money out beside money in, per part category: what arrived against order
// lists at the price paid (recorded when received; no processor involved; the same lines as the filing
// file's purchases and the spend CSV, lib/restock/purchases.ts) and what was sold (card and
// cash sales paid in the month, less the units refunded, at the price on the sale line).

export type SpendRow = { category: PartCategory; soldMinor: number; spentMinor: number };

export async function spendBesideSales(db: Db, ctx: Pick<Ctx, 'spaceId'>, month: Month): Promise<{ rows: SpendRow[]; currency: string }> {
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  const { from, to } = monthRange(month, timeZone);
  const [purchases, sold] = await Promise.all([
    purchasesReceived(db, ctx, { from, to }),
    scoped(db, ctx)
      .selectFrom('sale_lines')
      .innerJoin('sales', 'sales.id', 'sale_lines.sale_id')
      .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
      .select(['parts.category', sql<number>`sum(round((sale_lines.qty - sale_lines.refunded_qty) * sale_lines.unit_price_minor))::int`.as('minor')])
      .where('sales.status', 'in', ['paid', 'partially_refunded', 'refunded'])
      .where('sales.reverses_sale_id', 'is', null)
      .where('sales.paid_at', '>=', from)
      .where('sales.paid_at', '<', to)
      .groupBy('parts.category')
      .execute(),
  ]);
  const spentBy = new Map<PartCategory, number>();
  for (const p of purchases) spentBy.set(p.category, (spentBy.get(p.category) ?? 0) + p.costMinor);
  const categories = [...new Set([...spentBy.keys(), ...sold.map((r) => r.category)])].sort();
  return {
    currency,
    rows: categories.map((category) => ({
      category,
      soldMinor: sold.find((r) => r.category === category)?.minor ?? 0,
      spentMinor: spentBy.get(category) ?? 0,
    })),
  };
}
