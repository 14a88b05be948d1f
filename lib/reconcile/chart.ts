import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { monthRange, shiftMonth, spaceClock, type Month } from '@/lib/sales/periods';

export type MonthCategoryPoint = { month: Month } & Record<string, number | string>;

/** Sales (before refunds) per month and part category for the `months` months up to `until`. */
export async function salesByMonthAndCategory(
  db: Db,
  spaceId: string,
  until: Month,
  months = 12,
): Promise<{ points: MonthCategoryPoint[]; categories: string[] }> {
  const { timeZone } = await spaceClock(db, spaceId);
  const first = shiftMonth(until, -(months - 1));
  const { from } = monthRange(first, timeZone);
  const { to } = monthRange(until, timeZone);
  const rows = await scoped(db, { spaceId })
    .selectFrom('sale_lines')
    .innerJoin('sales', 'sales.id', 'sale_lines.sale_id')
    .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
    .select([
      sql<string>`to_char(sales.paid_at at time zone ${timeZone}, 'YYYY-MM')`.as('month'),
      'parts.category',
      sql<number>`sum(round(sale_lines.qty * sale_lines.unit_price_minor))::int`.as('minor'),
    ])
    .where('sales.space_id', '=', spaceId)
    .where('sales.status', 'in', ['paid', 'partially_refunded', 'refunded'])
    .where('sales.reverses_sale_id', 'is', null)
    .where('sales.paid_at', '>=', from)
    .where('sales.paid_at', '<', to)
    .groupBy(['month', 'parts.category'])
    .execute();
  const categories = [...new Set(rows.map((r) => r.category))].sort();
  const points: MonthCategoryPoint[] = [];
  for (let i = 0; i < months; i++) {
    const month = shiftMonth(first, i);
    const point: MonthCategoryPoint = { month };
    for (const c of categories)
      point[c] = rows.find((r) => r.month === month && r.category === c)?.minor ?? 0;
    points.push(point);
  }
  return { points, categories };
}
