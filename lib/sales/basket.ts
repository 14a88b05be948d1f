import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { PartCategory } from '@/db/types';
import { ConflictError, InvalidError, type FieldErrors } from '@/lib/errors';
import { formatQty, qtyProblem, roundQty, type Measure } from '@/lib/inventory/measure';
import { lineAmountMinor } from '@/lib/money';

export type PricedLine = {
  partId: string;
  name: string;
  category: PartCategory;
  saleUnit: Measure;
  qty: number;
  unitPriceMinor: number;
};

/**
 * Turns what the basket asked for into priced lines. Prices always come from the database, never
 * from the client; the same part asked for twice becomes one line. Field names in errors point at
 * the basket line the person typed (`lines.2.qty`).
 */
export async function priceBasket(
  db: Db,
  spaceId: string,
  lines: { partId: string; qty: number }[],
): Promise<PricedLine[]> {
  const wanted = new Map<string, { qty: number; index: number }>();
  lines.forEach((l, index) => {
    const seen = wanted.get(l.partId);
    wanted.set(l.partId, { qty: roundQty((seen?.qty ?? 0) + l.qty), index: seen?.index ?? index });
  });
  const ids = [...wanted.keys()];
  const parts = await scoped(db, { spaceId })
    .selectFrom('parts')
    .select(['id', 'name', 'category', 'sale_unit', 'price_minor', 'sellable', 'tracking', 'archived_at'])
    .select((eb) =>
      eb
        .selectFrom('stock')
        .select(sql<number>`coalesce(sum(stock.qty), 0)`.as('q'))
        .whereRef('stock.part_id', '=', 'parts.id')
        .as('on_shelf'),
    )
    .where('space_id', '=', spaceId)
    .where('id', 'in', ids)
    .execute();
  const byId = new Map(parts.map((p) => [p.id, p]));

  const invalid: FieldErrors = {};
  const short: FieldErrors = {};
  const priced: PricedLine[] = [];
  for (const [partId, { qty, index }] of wanted) {
    const p = byId.get(partId);
    if (!p) {
      // Another space's part reads as unknown here, never as "not yours".
      invalid[`lines.${index}.partId`] = ['No such item on this shelf.'];
      continue;
    }
    if (!p.sellable || p.price_minor === null || p.archived_at || p.tracking !== 'counted') {
      invalid[`lines.${index}.partId`] = [`${p.name} is not for sale at the counter.`];
      continue;
    }
    // Metres and grams may be fractions; a part sold as whole items refuses 1.5 (migration 0014).
    const problem = qtyProblem(qty, p.sale_unit);
    if (problem) {
      invalid[`lines.${index}.qty`] = [`The quantity of ${p.name} ${problem}.`];
      continue;
    }
    if (qty > (p.on_shelf ?? 0)) {
      short[`lines.${index}.qty`] = [`Only ${formatQty(p.on_shelf ?? 0, p.sale_unit)} left on the shelf.`];
      continue;
    }
    priced.push({
      partId,
      name: p.name,
      category: p.category,
      saleUnit: p.sale_unit,
      qty,
      unitPriceMinor: p.price_minor,
    });
  }
  if (Object.keys(invalid).length)
    throw new InvalidError(`Check ${Object.keys(invalid).join(', ')}.`, invalid);
  if (Object.keys(short).length) throw new ConflictError('Not enough on the shelf for this basket.', short);
  return priced;
}

/** Each line is round(qty × unit price), half away from zero (lib/money.ts lineAmountMinor); the total is their sum. */
export const basketTotal = (lines: { qty: number; unitPriceMinor: number }[]) =>
  lines.reduce((sum, l) => sum + lineAmountMinor(l.qty, l.unitPriceMinor), 0);
