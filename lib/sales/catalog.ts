import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Measure, PartCategory } from '@/db/types';

export type CatalogItem = {
  id: string;
  name: string;
  sku: string;
  code: string | null;
  category: PartCategory;
  saleUnit: Measure;
  priceMinor: number;
  onShelf: number;
};

/** What the counter sells: counted, priced, sellable, not archived parts, with what is on the shelf. */
export async function sellableCatalog(db: Db, spaceId: string): Promise<CatalogItem[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('parts')
    .leftJoin('stock', 'stock.part_id', 'parts.id')
    .select([
      'parts.id',
      'parts.name',
      'parts.sku',
      'parts.code',
      'parts.category',
      'parts.sale_unit',
      'parts.price_minor',
    ])
    .select(sql<number>`coalesce(sum(stock.qty), 0)`.as('on_shelf'))
    .where('parts.space_id', '=', spaceId)
    .where('parts.sellable', '=', true)
    .where('parts.tracking', '=', 'counted')
    .where('parts.archived_at', 'is', null)
    .where('parts.price_minor', 'is not', null)
    .groupBy('parts.id')
    .orderBy('parts.name')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    sku: r.sku,
    code: r.code,
    category: r.category,
    saleUnit: r.sale_unit,
    priceMinor: r.price_minor!,
    onShelf: r.on_shelf,
  }));
}

/** People a steward can ring a sale up for. */
export async function buyersOf(db: Db, spaceId: string): Promise<{ id: string; name: string }[]> {
  return scoped(db, { spaceId })
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name'])
    .where('memberships.space_id', '=', spaceId)
    .where('users.disabled_at', 'is', null)
    // Access switched off in this space: no longer someone to lend or sell to here.
    .where('memberships.disabled_at', 'is', null)
    .orderBy('users.name')
    .execute();
}
