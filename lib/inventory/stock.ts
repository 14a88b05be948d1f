import 'server-only';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { MovementReason } from '@/db/types';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError } from '@/lib/errors';
import type { adjustSchema, moveSchema } from './schemas';
import { refuseQtyNotInUnit } from './measure-check';
import { findLocation, findPart } from './scope';
import { inTransaction } from './tx';

// Counted stock changes. Each is one transaction: the quantity change (a single guarded statement,
// so two people taking the last one cannot both succeed), its stock_movements rows and the audit row.
// The table's own check (qty >= 0) is the last line of defence; the guards answer 409 before it.

async function countedPart(db: Db, ctx: Ctx, partId: string) {
  const part = await findPart(db, ctx, partId);
  if (part.tracking !== 'counted') {
    throw new InvalidError('This part is labelled unit by unit; add or move its units instead.', {
      partId: ['labelled parts are not counted in bins'],
    });
  }
  return part;
}

/** Adds n to a bin, creating the bin's row for the part when it is the first. Returns the new quantity. */
export async function addToBin(
  trx: Db,
  ctx: Ctx,
  partId: string,
  locationId: string,
  n: number,
): Promise<number> {
  const row = await scoped(trx, ctx)
    .insertInto('stock')
    .values({ space_id: ctx.spaceId, part_id: partId, location_id: locationId, qty: n })
    .onConflict((oc) =>
      oc
        .columns(['part_id', 'location_id'])
        .doUpdateSet((eb) => ({ qty: eb('stock.qty', '+', eb.ref('excluded.qty')), updated_at: now() })),
    )
    .returning('qty')
    .executeTakeFirstOrThrow();
  return row.qty;
}

/** Takes n out of a bin only if at least n are there; otherwise 409 naming `field`. */
async function takeFromBin(
  trx: Db,
  ctx: Ctx,
  partId: string,
  locationId: string,
  n: number,
  field: string,
): Promise<number> {
  const row = await scoped(trx, ctx)
    .updateTable('stock')
    .set((eb) => ({ qty: eb('qty', '-', n), updated_at: now() }))
    .where('part_id', '=', partId)
    .where('location_id', '=', locationId)
    .where('space_id', '=', ctx.spaceId)
    .where('qty', '>=', n)
    .returning('qty')
    .executeTakeFirst();
  if (row) return row.qty;
  const have = await scoped(trx, ctx)
    .selectFrom('stock')
    .select('qty')
    .where('part_id', '=', partId)
    .where('location_id', '=', locationId)
    .executeTakeFirst();
  throw new ConflictError(`Only ${have?.qty ?? 0} in that bin.`, {
    [field]: [`only ${have?.qty ?? 0} in that bin`],
  });
}

export async function recordMovement(
  trx: Db,
  ctx: Ctx,
  m: {
    partId: string;
    locationId: string;
    delta: number;
    reason: MovementReason;
    note: string;
    refType?: string;
    refId?: string;
  },
) {
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values({
      space_id: ctx.spaceId,
      part_id: m.partId,
      location_id: m.locationId,
      qty_delta: m.delta,
      reason: m.reason,
      note: m.note,
      ref_type: m.refType ?? null,
      ref_id: m.refId ?? null,
      actor_id: ctx.userId,
    })
    .execute();
}

// Stock arriving (the Receive page, an order list's arrival) is lib/inventory/receive.ts.

/** Moves n from one bin to another: both rows locked in a fixed order, so opposite moves cannot deadlock. */
export async function moveStock(db: Db, ctx: Ctx, input: z.output<typeof moveSchema>) {
  return inTransaction(db, async (trx) => {
    const part = await countedPart(trx, ctx, input.partId);
    refuseQtyNotInUnit(input.qty, part.sale_unit, 'qty');
    await findLocation(trx, ctx, input.fromLocationId);
    await findLocation(trx, ctx, input.toLocationId);
    await scoped(trx, ctx)
      .selectFrom('stock')
      .select('location_id')
      .where('part_id', '=', input.partId)
      .where('location_id', 'in', [input.fromLocationId, input.toLocationId])
      .orderBy('location_id')
      .forUpdate()
      .execute();
    const fromQty = await takeFromBin(trx, ctx, input.partId, input.fromLocationId, input.qty, 'qty');
    const toQty = await addToBin(trx, ctx, input.partId, input.toLocationId, input.qty);
    await recordMovement(trx, ctx, {
      partId: input.partId,
      locationId: input.fromLocationId,
      delta: -input.qty,
      reason: 'move_out',
      note: input.note,
    });
    await recordMovement(trx, ctx, {
      partId: input.partId,
      locationId: input.toLocationId,
      delta: input.qty,
      reason: 'move_in',
      note: input.note,
    });
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'stock.moved',
      targetType: 'part',
      targetId: input.partId,
      detail: { from: input.fromLocationId, to: input.toLocationId, qty: input.qty },
    });
    return { partId: input.partId, fromQty, toQty };
  });
}

/** A correction with a reason: found (+), lost, damaged or a plain adjustment (−). Never below zero. */
export async function adjustStock(db: Db, ctx: Ctx, input: z.output<typeof adjustSchema>) {
  if (input.reason !== 'adjust' && input.delta > 0) {
    throw new InvalidError('Lost or damaged stock only goes down.', {
      delta: [`a ${input.reason} adjustment must be negative`],
    });
  }
  return inTransaction(db, async (trx) => {
    const part = await countedPart(trx, ctx, input.partId);
    refuseQtyNotInUnit(input.delta, part.sale_unit, 'delta', 'change');
    await findLocation(trx, ctx, input.locationId);
    const qty =
      input.delta > 0
        ? await addToBin(trx, ctx, input.partId, input.locationId, input.delta)
        : await takeFromBin(trx, ctx, input.partId, input.locationId, -input.delta, 'delta');
    await recordMovement(trx, ctx, {
      partId: input.partId,
      locationId: input.locationId,
      delta: input.delta,
      reason: input.reason,
      note: input.note,
    });
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'stock.adjusted',
      targetType: 'part',
      targetId: input.partId,
      detail: { locationId: input.locationId, delta: input.delta, reason: input.reason, note: input.note },
    });
    return { partId: input.partId, locationId: input.locationId, qty };
  });
}
