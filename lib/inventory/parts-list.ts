import 'server-only';
import { sql, type Expression, type SqlBool } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { PartCategory } from '@/db/types';
import { verifyCode } from '@/labels/code';
import type { Ctx } from '@/lib/auth/roles';
import type { PartListQuery, PartSort } from './schemas';
import { partsToCsv } from './csv';
import { keySpec } from './specs';

// The parts table, paged, sorted and filtered in PostgreSQL so it stays quick at 10,000 parts:
// one query picks the page's ids (name order walks the (space_id, lower(name)) index), one fills
// in only the page's rows and stock figures, and the total is counted separately (in parallel).

export type PartRow = {
  id: string;
  sku: string;
  name: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  code: string | null;
  keySpec: string;
  /** Counted parts: the sum over bins. Labelled parts: units on the shelf. */
  onHand: number;
  /** Labelled parts: units not retired (on the shelf, out, held or in repair). */
  unitsTotal: number;
  reorderPoint: number;
  below: boolean;
  priceMinor: number | null;
  sellable: boolean;
  lendable: boolean;
  saleUnit: string;
  updatedAt: string;
  specs: Record<string, unknown>;
};

export type PartPage = { rows: PartRow[]; total: number; page: number; pageSize: number; currency: string };

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** Stock summed over bins, per part of the space (one pass over the space's stock rows). */
const stockTotals = (db: Db, spaceId: string) =>
  scoped(db, { spaceId })
    .selectFrom('stock')
    .select(['part_id', sql<number>`sum(qty)`.as('n')])
    .where('space_id', '=', spaceId)
    .groupBy('part_id');
/** Labelled units on the shelf, per part of the space. */
const shelfUnits = (db: Db, spaceId: string) =>
  scoped(db, { spaceId })
    .selectFrom('units')
    .select(['part_id', sql<number>`count(*)::int`.as('n')])
    .where('space_id', '=', spaceId)
    .where('state', '=', 'on_shelf')
    .groupBy('part_id');

/**
 * The filtered parts of the space. Sorting by on-hand joins the per-part totals (hash joins over the
 * space); the below-reorder filter asks each candidate's bins through the stock primary key instead,
 * so a name-ordered page stops after its first 50 hits.
 */
function filtered(db: Db, ctx: Pick<Ctx, 'spaceId'>, q: PartListQuery, withOnHand: boolean) {
  let qb = scoped(db, ctx)
    .selectFrom('parts')
    .$if(withOnHand, (qb) =>
      qb
        .leftJoin(stockTotals(db, ctx.spaceId).as('st'), 'st.part_id', 'parts.id')
        .leftJoin(shelfUnits(db, ctx.spaceId).as('su'), 'su.part_id', 'parts.id'),
    )
    .where('parts.space_id', '=', ctx.spaceId)
    .where('parts.archived_at', 'is', null);
  if (q.category) qb = qb.where('parts.category', '=', q.category);
  if (q.tracking) qb = qb.where('parts.tracking', '=', q.tracking);
  if (q.q) {
    const pattern = `%${escapeLike(q.q.toLowerCase())}%`;
    const code = verifyCode(q.q);
    qb = qb.where((eb) => {
      const terms: Expression<SqlBool>[] = [
        eb(eb.fn('lower', ['parts.name']), 'like', pattern),
        eb(eb.fn('lower', ['parts.sku']), 'like', pattern),
      ];
      if (code.ok) terms.push(eb('parts.code', '=', code.code));
      return eb.or(terms);
    });
  }
  if (q.below) {
    qb = qb
      .where('parts.tracking', '=', 'counted')
      .where('parts.reorder_point', '>', 0)
      .where(
        sql<SqlBool>`(select coalesce(sum(s.qty), 0) from stock s where s.space_id = parts.space_id and s.part_id = parts.id) < parts.reorder_point`,
      );
  }
  return qb;
}

const SORT_SQL: Record<PartSort, ReturnType<typeof sql>> = {
  name: sql`lower(parts.name)`,
  sku: sql`parts.sku`,
  category: sql`parts.category`,
  onHand: sql`coalesce(st.n, 0) + coalesce(su.n, 0)`,
  reorderPoint: sql`parts.reorder_point`,
  updatedAt: sql`parts.updated_at`,
};

/** The page's rows with their stock figures, in the order of `ids`. */
async function rowsFor(db: Db, spaceId: string, ids: string[]): Promise<PartRow[]> {
  if (!ids.length) return [];
  const rows = await scoped(db, { spaceId })
    .selectFrom('parts')
    .select([
      'parts.id',
      'parts.sku',
      'parts.name',
      'parts.category',
      'parts.tracking',
      'parts.code',
      'parts.specs',
      'parts.reorder_point',
      'parts.price_minor',
      'parts.sellable',
      'parts.lendable',
      'parts.sale_unit',
      'parts.updated_at',
    ])
    .select((eb) => [
      eb
        .selectFrom('stock')
        .select(sql<number>`coalesce(sum(qty), 0)`.as('n'))
        .whereRef('stock.part_id', '=', 'parts.id')
        .as('stockQty'),
      eb
        .selectFrom('units')
        .select(sql<number>`count(*) filter (where state = 'on_shelf')::int`.as('n'))
        .whereRef('units.part_id', '=', 'parts.id')
        .as('unitsOnShelf'),
      eb
        .selectFrom('units')
        .select(sql<number>`count(*) filter (where state <> 'retired')::int`.as('n'))
        .whereRef('units.part_id', '=', 'parts.id')
        .as('unitsTotal'),
    ])
    .where('parts.id', 'in', ids)
    .execute();
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.map((id) => {
    const r = byId.get(id)!;
    const onHand = (r.stockQty ?? 0) + (r.unitsOnShelf ?? 0);
    return {
      id: r.id,
      sku: r.sku,
      name: r.name,
      category: r.category,
      tracking: r.tracking,
      code: r.code,
      keySpec: keySpec(r.category, r.specs),
      onHand,
      unitsTotal: r.unitsTotal ?? 0,
      reorderPoint: r.reorder_point,
      below: r.tracking === 'counted' && r.reorder_point > 0 && onHand < r.reorder_point,
      priceMinor: r.price_minor,
      sellable: r.sellable,
      lendable: r.lendable,
      saleUnit: r.sale_unit,
      updatedAt: r.updated_at.toISOString(),
      specs: r.specs,
    };
  });
}

/** Ids of the parts matching the query, sorted, from `offset`, at most `limit`. */
async function pageIds(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  q: PartListQuery,
  offset: number,
  limit: number,
): Promise<string[]> {
  const withOnHand = q.sort === 'onHand';
  const dir = q.dir === 'desc' ? sql`desc` : sql`asc`;
  const rows = await filtered(db, ctx, q, withOnHand)
    .select('parts.id')
    .orderBy(sql`${SORT_SQL[q.sort]} ${dir}`)
    .$if(q.sort === 'category', (qb) => qb.orderBy(sql`lower(parts.name)`))
    .orderBy('parts.id')
    .offset(offset)
    .limit(limit)
    .execute();
  return rows.map((r) => r.id);
}

export async function listParts(db: Db, ctx: Pick<Ctx, 'spaceId'>, q: PartListQuery): Promise<PartPage> {
  const offset = (q.page - 1) * q.pageSize;
  const [ids, count, space] = await Promise.all([
    pageIds(db, ctx, q, offset, q.pageSize),
    filtered(db, ctx, q, false)
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .executeTakeFirstOrThrow(),
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return {
    rows: await rowsFor(db, ctx.spaceId, ids),
    total: count.n,
    page: q.page,
    pageSize: q.pageSize,
    currency: space.currency.trim(),
  };
}

/** Every matching part (no paging) for the CSV export, in the table's order. */
export async function allMatchingParts(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  q: PartListQuery,
  cap = 20_000,
): Promise<PartRow[]> {
  const ids = await pageIds(db, ctx, q, 0, cap);
  const rows: PartRow[] = [];
  for (let i = 0; i < ids.length; i += 1000) rows.push(...(await rowsFor(db, ctx.spaceId, ids.slice(i, i + 1000))));
  return rows;
}

/** The parts table as the CSV download: same filters and order as the screen, the space's currency. */
export async function exportPartsCsv(db: Db, ctx: Pick<Ctx, 'spaceId'>, q: PartListQuery): Promise<string> {
  const [rows, space] = await Promise.all([
    allMatchingParts(db, ctx, q),
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return partsToCsv(rows, space.currency.trim());
}
