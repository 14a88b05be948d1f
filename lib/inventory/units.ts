import 'server-only';
import { randomUUID } from 'node:crypto';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { UnitState } from '@/db/types';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { issueCodes } from './codes';
import type { moveUnitSchema, unitStateSchema } from './schemas';
import { assertId, findLocation } from './scope';
import { inTransaction } from './tx';

/** Inside the caller's transaction: `count` new units on the shelf, each with its own code and a receive movement. */
export async function insertUnits(
  trx: Db,
  ctx: Ctx,
  part: { id: string; sku: string },
  count: number,
  locationId: string | null,
  serialPrefix?: string,
  movement: { note?: string; refType?: string; refId?: string } = {},
): Promise<{ id: string; code: string }[]> {
  const existing = await scoped(trx, ctx)
    .selectFrom('units')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('part_id', '=', part.id)
    .executeTakeFirstOrThrow();
  const ids = Array.from({ length: count }, () => randomUUID());
  const codes = await issueCodes(trx, ctx.spaceId, 'unit', ids);
  const prefix = serialPrefix || part.sku;
  await scoped(trx, ctx)
    .insertInto('units')
    .values(
      ids.map((id, i) => ({
        id,
        space_id: ctx.spaceId,
        part_id: part.id,
        code: codes[i],
        serial: `${prefix}-${String(existing.n + i + 1).padStart(2, '0')}`,
        location_id: locationId,
      })),
    )
    .execute();
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values(
      ids.map((id) => ({
        space_id: ctx.spaceId,
        part_id: part.id,
        location_id: locationId,
        unit_id: id,
        qty_delta: 1,
        reason: 'receive' as const,
        note: movement.note || 'labelled unit added',
        ref_type: movement.refType ?? null,
        ref_id: movement.refId ?? null,
        actor_id: ctx.userId,
      })),
    )
    .execute();
  return ids.map((id, i) => ({ id, code: codes[i] }));
}

/** Which states a steward may move a unit to, from each state. Out and held belong to loans. */
const ALLOWED_FROM: Record<z.output<typeof unitStateSchema>['state'], UnitState[]> = {
  in_repair: ['on_shelf'],
  on_shelf: ['in_repair'],
  retired: ['on_shelf', 'in_repair'],
};

const STATE_WORDS: Record<UnitState, string> = {
  on_shelf: 'on the shelf',
  out: 'out on loan',
  held: 'held for someone',
  in_repair: 'in repair',
  retired: 'retired',
};

/** To repair, back on the shelf, or retired — with the reason kept on the unit and in the history. */
export async function changeUnitState(
  db: Db,
  ctx: Ctx,
  unitId: string,
  input: z.output<typeof unitStateSchema>,
) {
  assertId(unitId, 'unit');
  return inTransaction(db, async (trx) => {
    const unit = await scoped(trx, ctx)
      .selectFrom('units')
      .selectAll()
      .where('id', '=', unitId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!unit) throw new NotFoundError('No such unit.');
    if (!ALLOWED_FROM[input.state].includes(unit.state)) {
      throw new ConflictError(
        `This unit is ${STATE_WORDS[unit.state]}; it cannot go ${STATE_WORDS[input.state]} from there.`,
        {
          state: [`not allowed while the unit is ${STATE_WORDS[unit.state]}`],
        },
      );
    }
    if (unit.kit_box_id) {
      throw new ConflictError(
        'This unit sits in a kit box; take it out first on the box’s page (Look after this box).',
        {
          state: ['the unit is in a kit box'],
        },
      );
    }
    const locationId = input.locationId === undefined ? unit.location_id : input.locationId;
    if (locationId && locationId !== unit.location_id) await findLocation(trx, ctx, locationId);
    await scoped(trx, ctx)
      .updateTable('units')
      .set({ state: input.state, notes: input.reason, location_id: locationId, updated_at: now() })
      .where('id', '=', unit.id)
      .execute();
    await scoped(trx, ctx)
      .insertInto('stock_movements')
      .values({
        space_id: ctx.spaceId,
        part_id: unit.part_id,
        location_id: locationId,
        unit_id: unit.id,
        qty_delta: input.state === 'retired' ? -1 : 0,
        reason: input.state === 'retired' ? 'retire' : 'repair',
        note: `${STATE_WORDS[unit.state]} → ${STATE_WORDS[input.state]}: ${input.reason}`,
        actor_id: ctx.userId,
      })
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'unit.state',
      targetType: 'unit',
      targetId: unit.id,
      detail: { from: unit.state, to: input.state, reason: input.reason },
    });
    return { id: unit.id, state: input.state };
  });
}

/** Puts a unit in another bin; its state does not change. */
export async function moveUnit(db: Db, ctx: Ctx, input: z.output<typeof moveUnitSchema>) {
  return inTransaction(db, async (trx) => {
    const unit = await scoped(trx, ctx)
      .selectFrom('units')
      .selectAll()
      .where('id', '=', input.unitId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!unit) throw new NotFoundError('No such unit.');
    if (unit.kit_box_id)
      throw new ConflictError('This unit sits in a kit box; move the box instead.', {
        unitId: ['the unit is in a kit box'],
      });
    if (unit.state === 'out' || unit.state === 'retired') {
      throw new ConflictError(`This unit is ${STATE_WORDS[unit.state]}.`, {
        unitId: [`the unit is ${STATE_WORDS[unit.state]}`],
      });
    }
    await findLocation(trx, ctx, input.toLocationId);
    if (unit.location_id === input.toLocationId)
      throw new InvalidError('The unit is in that bin already.', {
        toLocationId: ['the unit is there already'],
      });
    await scoped(trx, ctx)
      .updateTable('units')
      .set({ location_id: input.toLocationId, updated_at: now() })
      .where('id', '=', unit.id)
      .execute();
    await scoped(trx, ctx)
      .insertInto('stock_movements')
      .values([
        {
          space_id: ctx.spaceId,
          part_id: unit.part_id,
          location_id: unit.location_id,
          unit_id: unit.id,
          qty_delta: 0,
          reason: 'move_out',
          note: input.note,
          actor_id: ctx.userId,
        },
        {
          space_id: ctx.spaceId,
          part_id: unit.part_id,
          location_id: input.toLocationId,
          unit_id: unit.id,
          qty_delta: 0,
          reason: 'move_in',
          note: input.note,
          actor_id: ctx.userId,
        },
      ])
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'unit.moved',
      targetType: 'unit',
      targetId: unit.id,
      detail: { from: unit.location_id, to: input.toLocationId },
    });
    return { id: unit.id };
  });
}

/** Units waiting for repair, with the note and since when. */
export async function listRepairs(db: Db, ctx: Ctx) {
  return scoped(db, ctx)
    .selectFrom('units')
    .innerJoin('parts', 'parts.id', 'units.part_id')
    .leftJoin('locations', 'locations.id', 'units.location_id')
    .select([
      'units.id',
      'units.code',
      'units.serial',
      'units.notes',
      'units.updated_at',
      'parts.id as partId',
      'parts.name as partName',
      'parts.sku',
      'locations.name as locationName',
    ])
    .select((eb) =>
      eb
        .selectFrom('stock_movements')
        .select((m) => m.fn.max('stock_movements.created_at').as('at'))
        .whereRef('stock_movements.unit_id', '=', 'units.id')
        .where('stock_movements.reason', '=', 'repair')
        .as('since'),
    )
    .where('units.space_id', '=', ctx.spaceId)
    .where('units.state', '=', 'in_repair')
    .orderBy('parts.name')
    .orderBy('units.serial')
    .execute();
}
