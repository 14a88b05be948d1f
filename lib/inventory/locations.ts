import 'server-only';
import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { issueCode } from './codes';
import type { locationCreateSchema, locationUpdateSchema } from './schemas';
import { assertId, findLocation } from './scope';
import { inTransaction, isUniqueViolation } from './tx';

const NAME_TAKEN = (name: string) =>
  new ConflictError(`A location called "${name}" exists already.`, {
    name: ['already used by another location'],
  });

/** Every bin, shelf and drawer of the space with what it holds. */
export async function listLocations(db: Db, ctx: Pick<Ctx, 'spaceId'>) {
  return scoped(db, ctx)
    .selectFrom('locations')
    .leftJoin('locations as parent', 'parent.id', 'locations.parent_id')
    .select([
      'locations.id',
      'locations.name',
      'locations.code',
      'locations.kind',
      'locations.parent_id as parentId',
      'parent.name as parentName',
    ])
    .select((eb) => [
      eb
        .selectFrom('stock')
        .select(sql<number>`count(*) filter (where qty > 0)::int`.as('n'))
        .whereRef('stock.location_id', '=', 'locations.id')
        .as('partsStocked'),
      eb
        .selectFrom('units')
        .select(sql<number>`count(*)::int`.as('n'))
        .whereRef('units.location_id', '=', 'locations.id')
        .where('units.state', '<>', 'retired')
        .as('units'),
    ])
    .where('locations.space_id', '=', ctx.spaceId)
    .orderBy('locations.name')
    .execute();
}

/** One location with its counted stock, units and kit boxes. */
export async function getLocation(db: Db, ctx: Pick<Ctx, 'spaceId'>, id: string) {
  const location = await findLocation(db, ctx, id);
  const [stock, units, boxes] = await Promise.all([
    scoped(db, ctx)
      .selectFrom('stock')
      .innerJoin('parts', 'parts.id', 'stock.part_id')
      .select(['parts.id as partId', 'parts.name', 'parts.sku', 'stock.qty'])
      .where('stock.location_id', '=', id)
      .where('stock.qty', '>', 0)
      .orderBy('parts.name')
      .execute(),
    scoped(db, ctx)
      .selectFrom('units')
      .innerJoin('parts', 'parts.id', 'units.part_id')
      .select(['units.id', 'units.code', 'units.serial', 'units.state', 'parts.id as partId', 'parts.name'])
      .where('units.location_id', '=', id)
      .where('units.state', '<>', 'retired')
      .orderBy('parts.name')
      .orderBy('units.serial')
      .execute(),
    scoped(db, ctx)
      .selectFrom('kit_boxes')
      .select(['id', 'name', 'code', 'state'])
      .where('location_id', '=', id)
      .where('space_id', '=', ctx.spaceId)
      .orderBy('name')
      .execute(),
  ]);
  return { location, stock, units, boxes };
}

async function checkParent(db: Db, ctx: Ctx, id: string | null, parentId: string | null | undefined) {
  if (!parentId) return;
  if (parentId === id)
    throw new InvalidError('A location cannot sit inside itself.', { parentId: ['choose another location'] });
  await findLocation(db, ctx, parentId);
}

export async function createLocation(db: Db, ctx: Ctx, input: z.output<typeof locationCreateSchema>) {
  return inTransaction(db, async (trx) => {
    await checkParent(trx, ctx, null, input.parentId);
    const id = randomUUID();
    const code = await issueCode(trx, ctx.spaceId, 'location', id);
    try {
      await scoped(trx, ctx)
        .insertInto('locations')
        .values({
          id,
          space_id: ctx.spaceId,
          name: input.name,
          kind: input.kind,
          parent_id: input.parentId ?? null,
          code,
        })
        .execute();
    } catch (err) {
      if (isUniqueViolation(err, 'locations_space_name_uq')) throw NAME_TAKEN(input.name);
      throw err;
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'location.created',
      targetType: 'location',
      targetId: id,
      detail: { name: input.name },
    });
    return { id, code, name: input.name };
  });
}

export async function updateLocation(
  db: Db,
  ctx: Ctx,
  id: string,
  input: z.output<typeof locationUpdateSchema>,
) {
  return inTransaction(db, async (trx) => {
    await findLocation(trx, ctx, id);
    await checkParent(trx, ctx, id, input.parentId);
    const set = {
      ...(input.name !== undefined ? { name: input.name } : {}),
      ...(input.kind !== undefined ? { kind: input.kind } : {}),
      ...(input.parentId !== undefined ? { parent_id: input.parentId } : {}),
    };
    if (!Object.keys(set).length) return { id };
    try {
      await scoped(trx, ctx)
        .updateTable('locations')
        .set(set)
        .where('id', '=', id)
        .where('space_id', '=', ctx.spaceId)
        .execute();
    } catch (err) {
      if (isUniqueViolation(err, 'locations_space_name_uq')) throw NAME_TAKEN(input.name ?? '');
      throw err;
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'location.updated',
      targetType: 'location',
      targetId: id,
      detail: { changed: Object.keys(set) },
    });
    return { id };
  });
}

/** Only an empty location can go; its label code stays registered (a printed label then reads "not found"). */
export async function deleteLocation(db: Db, ctx: Ctx, id: string) {
  assertId(id, 'location');
  return inTransaction(db, async (trx) => {
    const loc = await scoped(trx, ctx)
      .selectFrom('locations')
      .selectAll()
      .where('id', '=', id)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!loc) throw new NotFoundError('No such location.');
    const busy = await scoped(trx, ctx)
      .selectFrom('stock')
      .select(sql<string>`'stock'`.as('what'))
      .where('location_id', '=', id)
      .where('qty', '>', 0)
      .unionAll(
        scoped(trx, ctx)
          .selectFrom('units')
          .select(sql<string>`'units'`.as('what'))
          .where('location_id', '=', id)
          .where('state', '<>', 'retired'),
      )
      .unionAll(
        scoped(trx, ctx)
          .selectFrom('kit_boxes')
          .select(sql<string>`'kit boxes'`.as('what'))
          .where('location_id', '=', id),
      )
      .unionAll(
        scoped(trx, ctx)
          .selectFrom('stock_counts')
          .select(sql<string>`'an open count'`.as('what'))
          .where('location_id', '=', id)
          .where('status', '=', 'open'),
      )
      .limit(1)
      .executeTakeFirst();
    if (busy)
      throw new ConflictError(`"${loc.name}" still holds ${busy.what}; empty it first.`, {
        id: [`still holds ${busy.what}`],
      });
    await scoped(trx, ctx).deleteFrom('stock').where('location_id', '=', id).execute();
    await scoped(trx, ctx).deleteFrom('locations').where('id', '=', id).execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'location.deleted',
      targetType: 'location',
      targetId: id,
      detail: { name: loc.name },
    });
    return { id };
  });
}
