import 'server-only';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { measureOf, qtyProblem, roundQty } from './measure';
import type { countLinesSchema } from './schemas';
import { assertId, findLocation } from './scope';
import { inTransaction } from './tx';

// Stock count of one bin: open (snapshot of what the books say), enter counts, review the variance
// against the bin as it is now, post (the counted figures become the stock, with 'count' movements).

type CountLine = { partId: string; expected: number; counted: number | null };

/** Opens a count for a bin, or returns the one already open there. */
export async function openCount(db: Db, ctx: Ctx, locationId: string) {
  return inTransaction(db, async (trx) => {
    // Lock the location row so two stewards opening at once end up with one count.
    await findLocation(trx, ctx, locationId);
    await scoped(trx, ctx).selectFrom('locations').select('id').where('id', '=', locationId).forUpdate().execute();
    const open = await scoped(trx, ctx)
      .selectFrom('stock_counts')
      .select('id')
      .where('location_id', '=', locationId)
      .where('space_id', '=', ctx.spaceId)
      .where('status', '=', 'open')
      .executeTakeFirst();
    if (open) return { id: open.id, created: false };
    const stock = await scoped(trx, ctx)
      .selectFrom('stock')
      .innerJoin('parts', 'parts.id', 'stock.part_id')
      .select(['stock.part_id', 'stock.qty'])
      .where('stock.location_id', '=', locationId)
      .where('parts.tracking', '=', 'counted')
      .orderBy('parts.name')
      .execute();
    const lines: CountLine[] = stock.map((s) => ({ partId: s.part_id, expected: s.qty, counted: null }));
    const row = await scoped(trx, ctx)
      .insertInto('stock_counts')
      .values({
        space_id: ctx.spaceId,
        location_id: locationId,
        lines: JSON.stringify(lines),
        created_by: ctx.userId,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'count.opened',
      targetType: 'stock_count',
      targetId: row.id,
      detail: { locationId },
    });
    return { id: row.id, created: true };
  });
}

/** Open counts of the space, newest first. */
export async function listOpenCounts(db: Db, ctx: Pick<Ctx, 'spaceId'>) {
  return scoped(db, ctx)
    .selectFrom('stock_counts')
    .innerJoin('locations', 'locations.id', 'stock_counts.location_id')
    .select([
      'stock_counts.id',
      'stock_counts.created_at as createdAt',
      'locations.id as locationId',
      'locations.name as locationName',
    ])
    .where('stock_counts.space_id', '=', ctx.spaceId)
    .where('stock_counts.status', '=', 'open')
    .orderBy('stock_counts.created_at', 'desc')
    .execute();
}

/** A count with each line's part, the snapshot, the count, the bin's quantity now and the variance. */
export async function getCount(db: Db, ctx: Pick<Ctx, 'spaceId'>, id: string) {
  assertId(id, 'count');
  const count = await scoped(db, ctx)
    .selectFrom('stock_counts')
    .innerJoin('locations', 'locations.id', 'stock_counts.location_id')
    .select([
      'stock_counts.id',
      'stock_counts.status',
      'stock_counts.lines',
      'stock_counts.created_at as createdAt',
      'stock_counts.posted_at as postedAt',
      'locations.id as locationId',
      'locations.name as locationName',
      'locations.code as locationCode',
    ])
    .where('stock_counts.id', '=', id)
    .where('stock_counts.space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!count) throw new NotFoundError('No such count.');
  const ids = count.lines.map((l) => l.partId);
  const [parts, stock] = ids.length
    ? await Promise.all([
        scoped(db, ctx)
          .selectFrom('parts')
          .select(['id', 'name', 'sku', 'code', 'sale_unit'])
          .where('id', 'in', ids)
          .execute(),
        scoped(db, ctx)
          .selectFrom('stock')
          .select(['part_id', 'qty'])
          .where('location_id', '=', count.locationId)
          .where('part_id', 'in', ids)
          .execute(),
      ])
    : [[], []];
  const partById = new Map(parts.map((p) => [p.id, p]));
  const qtyById = new Map(stock.map((s) => [s.part_id, s.qty]));
  const lines = count.lines.map((l) => {
    const current = qtyById.get(l.partId) ?? 0;
    const p = partById.get(l.partId);
    return {
      ...l,
      name: p?.name ?? '(removed part)',
      sku: p?.sku ?? '',
      code: p?.code ?? null,
      measure: measureOf(p?.sale_unit),
      current,
      variance: l.counted === null ? null : roundQty(l.counted - current),
    };
  });
  return { ...count, lines };
}

async function lockOpenCount(trx: Db, ctx: Ctx, id: string) {
  assertId(id, 'count');
  const count = await scoped(trx, ctx)
    .selectFrom('stock_counts')
    .selectAll()
    .where('id', '=', id)
    .where('space_id', '=', ctx.spaceId)
    .forUpdate()
    .executeTakeFirst();
  if (!count) throw new NotFoundError('No such count.');
  if (count.status !== 'open')
    throw new ConflictError(`This count is ${count.status} already.`, {
      status: [`the count is ${count.status}`],
    });
  return count;
}

/** Records counted figures; a part not yet on the list (found in the bin) joins it with expected 0 or its stock. */
export async function saveCountLines(db: Db, ctx: Ctx, id: string, input: z.output<typeof countLinesSchema>) {
  return inTransaction(db, async (trx) => {
    const count = await lockOpenCount(trx, ctx, id);
    const lines = [...count.lines];
    await refuseQtyNotInUnit(trx, ctx, input.lines);
    const newIds = input.lines.map((l) => l.partId).filter((p) => !lines.some((l) => l.partId === p));
    if (newIds.length) {
      const parts = await scoped(trx, ctx)
        .selectFrom('parts')
        .leftJoin('stock', (j) =>
          j.onRef('stock.part_id', '=', 'parts.id').on('stock.location_id', '=', count.location_id),
        )
        .select(['parts.id', 'parts.tracking', 'stock.qty'])
        .where('parts.id', 'in', newIds)
        .where('parts.space_id', '=', ctx.spaceId)
        .execute();
      for (const [i, line] of input.lines.entries()) {
        if (!newIds.includes(line.partId)) continue;
        const part = parts.find((p) => p.id === line.partId);
        if (!part) throw new NotFoundError('No such part.');
        if (part.tracking !== 'counted')
          throw new InvalidError('Labelled units are not counted by quantity.', {
            [`lines.${i}.partId`]: ['this part is labelled unit by unit'],
          });
        lines.push({ partId: part.id, expected: part.qty ?? 0, counted: null });
      }
    }
    for (const line of input.lines) {
      const target = lines.find((l) => l.partId === line.partId)!;
      target.counted = line.counted;
    }
    await scoped(trx, ctx)
      .updateTable('stock_counts')
      .set({ lines: JSON.stringify(lines) })
      .where('id', '=', id)
      .execute();
    return { id, lines: lines.length };
  });
}

/** 400 naming `lines.N.counted` when a count has a fraction of a part counted in whole items. */
async function refuseQtyNotInUnit(trx: Db, ctx: Ctx, input: { partId: string; counted: number | null }[]) {
  const ids = [...new Set(input.filter((l) => l.counted !== null).map((l) => l.partId))];
  if (!ids.length) return;
  const parts = await scoped(trx, ctx).selectFrom('parts').select(['id', 'sale_unit']).where('id', 'in', ids).execute();
  const unitOf = new Map(parts.map((p) => [p.id, measureOf(p.sale_unit)]));
  const fields: Record<string, string[]> = {};
  input.forEach((l, i) => {
    const problem = l.counted === null ? null : qtyProblem(l.counted, unitOf.get(l.partId) ?? 'each');
    if (problem) fields[`lines.${i}.counted`] = [`the count ${problem}`];
  });
  if (Object.keys(fields).length) throw new InvalidError(`Check ${Object.keys(fields).join(', ')}.`, fields);
}

/** Makes the counted figures the bin's stock; each difference becomes a 'count' movement. */
export async function postCount(db: Db, ctx: Ctx, id: string) {
  return inTransaction(db, async (trx) => {
    const count = await lockOpenCount(trx, ctx, id);
    const counted = count.lines.filter((l) => l.counted !== null) as (CountLine & { counted: number })[];
    if (!counted.length)
      throw new InvalidError('Enter at least one count before posting.', {
        lines: ['no line has a count yet'],
      });
    const changes: { partId: string; before: number; after: number }[] = [];
    for (const line of counted) {
      const row = await scoped(trx, ctx)
        .selectFrom('stock')
        .select('qty')
        .where('part_id', '=', line.partId)
        .where('location_id', '=', count.location_id)
        .forUpdate()
        .executeTakeFirst();
      const before = row?.qty ?? 0;
      if (before === line.counted) continue;
      await scoped(trx, ctx)
        .insertInto('stock')
        .values({
          space_id: ctx.spaceId,
          part_id: line.partId,
          location_id: count.location_id,
          qty: line.counted,
        })
        .onConflict((oc) =>
          oc.columns(['part_id', 'location_id']).doUpdateSet({ qty: line.counted, updated_at: now() }),
        )
        .execute();
      await scoped(trx, ctx)
        .insertInto('stock_movements')
        .values({
          space_id: ctx.spaceId,
          part_id: line.partId,
          location_id: count.location_id,
          qty_delta: roundQty(line.counted - before),
          reason: 'count',
          ref_type: 'stock_count',
          ref_id: id,
          note: `counted ${line.counted}, books said ${before}`,
          actor_id: ctx.userId,
        })
        .execute();
      changes.push({ partId: line.partId, before, after: line.counted });
    }
    await scoped(trx, ctx)
      .updateTable('stock_counts')
      .set({ status: 'posted', posted_at: now() })
      .where('id', '=', id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'count.posted',
      targetType: 'stock_count',
      targetId: id,
      detail: { locationId: count.location_id, lines: counted.length, changes },
    });
    return { id, changed: changes.length, changes };
  });
}

export async function abandonCount(db: Db, ctx: Ctx, id: string) {
  return inTransaction(db, async (trx) => {
    await lockOpenCount(trx, ctx, id);
    await scoped(trx, ctx).updateTable('stock_counts').set({ status: 'abandoned' }).where('id', '=', id).execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'count.abandoned',
      targetType: 'stock_count',
      targetId: id,
    });
    return { id };
  });
}
