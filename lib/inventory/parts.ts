import 'server-only';
import { randomUUID } from 'node:crypto';
import type { z } from 'zod';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { PartUpdate } from '@/db/types';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { issueCode } from './codes';
import type { partCreateSchema, partUpdateSchema } from './schemas';
import { assertId, findLocation } from './scope';
import { parseSpecs } from './specs';
import { isUniqueViolation, inTransaction } from './tx';
import { insertUnits } from './units';

export type PartCreate = z.output<typeof partCreateSchema>;
export type PartPatch = z.output<typeof partUpdateSchema>;

const SKU_TAKEN = (sku: string) =>
  new ConflictError(`SKU ${sku} is already used by another part.`, { sku: ['already used by another part'] });

function checkSpecs(
  category: PartCreate['category'],
  specs: Record<string, unknown>,
): Record<string, unknown> {
  const result = parseSpecs(category, specs);
  if (!result.ok) throw new InvalidError(`Check ${Object.keys(result.fields).join(', ')}.`, result.fields);
  return result.specs;
}

function checkPrice(sellable: boolean, priceMinor: number | null): void {
  if (sellable && priceMinor === null)
    throw new InvalidError('A part on sale needs a price.', { priceMinor: ['a part on sale needs a price'] });
}

/** Adds a part (and, for labelled parts, its first units), with its own label code. */
export async function createPart(db: Db, ctx: Ctx, input: PartCreate) {
  const specs = checkSpecs(input.category, input.specs);
  checkPrice(input.sellable, input.priceMinor);
  if (input.tracking === 'unit' && input.saleUnit !== 'each') {
    throw new InvalidError('Labelled units are one thing each.', { saleUnit: ['labelled units are always each'] });
  }
  if (input.tracking === 'counted' && input.units > 0) {
    throw new InvalidError('Counted parts have no labelled units; receive stock instead.', {
      units: ['only labelled parts have units'],
    });
  }
  return inTransaction(db, async (trx) => {
    if (input.locationId) await findLocation(trx, ctx, input.locationId);
    const id = randomUUID();
    const code = await issueCode(trx, ctx.spaceId, 'part', id);
    try {
      await scoped(trx, ctx)
        .insertInto('parts')
        .values({
          id,
          space_id: ctx.spaceId,
          sku: input.sku,
          name: input.name,
          category: input.category,
          tracking: input.tracking,
          specs: JSON.stringify(specs),
          code,
          sellable: input.sellable,
          lendable: input.lendable,
          price_minor: input.priceMinor,
          sale_unit: input.saleUnit,
          reorder_point: input.reorderPoint,
          notes: input.notes,
        })
        .execute();
    } catch (err) {
      if (isUniqueViolation(err, 'parts_space_sku_uq')) throw SKU_TAKEN(input.sku);
      throw err;
    }
    const units =
      input.units > 0
        ? await insertUnits(trx, ctx, { id, sku: input.sku }, input.units, input.locationId ?? null)
        : [];
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'part.created',
      targetType: 'part',
      targetId: id,
      detail: { sku: input.sku, name: input.name, units: units.length },
    });
    return { id, code, sku: input.sku, units };
  });
}

/** Edits a part; specs are re-validated against the (possibly new) category. */
export async function updatePart(db: Db, ctx: Ctx, id: string, patch: PartPatch) {
  assertId(id, 'part');
  return inTransaction(db, async (trx) => {
    const current = await scoped(trx, ctx)
      .selectFrom('parts')
      .selectAll()
      .where('id', '=', id)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!current) throw new NotFoundError('No such part.');
    const category = patch.category ?? current.category;
    const set: PartUpdate = { updated_at: now() };
    checkPrice(
      patch.sellable ?? current.sellable,
      patch.priceMinor !== undefined ? patch.priceMinor : current.price_minor,
    );

    if (patch.specs !== undefined || patch.category !== undefined) {
      set.specs = JSON.stringify(checkSpecs(category, patch.specs ?? current.specs));
      set.category = category;
    }
    if (patch.tracking !== undefined && patch.tracking !== current.tracking) {
      const held = await scoped(trx, ctx)
        .selectFrom('stock')
        .select('qty')
        .where('part_id', '=', id)
        .where('qty', '>', 0)
        .unionAll(
          scoped(trx, ctx)
            .selectFrom('units')
            .select((eb) => eb.lit(1).as('qty'))
            .where('part_id', '=', id),
        )
        .limit(1)
        .executeTakeFirst();
      if (held) {
        throw new ConflictError(
          'This part already has stock or units; tracking can change only while it has none.',
          {
            tracking: ['only a part without stock or units can change how it is tracked'],
          },
        );
      }
      set.tracking = patch.tracking;
    }

    const unitAfter = patch.saleUnit ?? current.sale_unit;
    if ((patch.tracking ?? current.tracking) === 'unit' && unitAfter !== 'each') {
      throw new InvalidError('Labelled units are one thing each.', { saleUnit: ['labelled units are always each'] });
    }
    if (unitAfter === 'each' && current.sale_unit !== 'each') {
      // Back to whole items only while no bin holds a fraction (65.5 m cannot become 65.5 items).
      const fraction = await scoped(trx, ctx)
        .selectFrom('stock')
        .select('qty')
        .where('part_id', '=', id)
        .where(sql<boolean>`qty <> trunc(qty)`)
        .limit(1)
        .executeTakeFirst();
      if (fraction) {
        throw new ConflictError('A bin holds a fraction of this part; count it in whole items first.', {
          saleUnit: [`a bin holds ${fraction.qty}: whole items cannot be fractions`],
        });
      }
    }

    if (patch.sku !== undefined) set.sku = patch.sku;
    if (patch.name !== undefined) set.name = patch.name;
    if (patch.sellable !== undefined) set.sellable = patch.sellable;
    if (patch.lendable !== undefined) set.lendable = patch.lendable;
    if (patch.priceMinor !== undefined) set.price_minor = patch.priceMinor;
    if (patch.saleUnit !== undefined) set.sale_unit = patch.saleUnit;
    if (patch.reorderPoint !== undefined) set.reorder_point = patch.reorderPoint;
    if (patch.notes !== undefined) set.notes = patch.notes;
    if (patch.archived !== undefined)
      set.archived_at = patch.archived ? (current.archived_at ?? now()) : null;

    try {
      await scoped(trx, ctx).updateTable('parts').set(set).where('id', '=', id).execute();
    } catch (err) {
      if (isUniqueViolation(err, 'parts_space_sku_uq')) throw SKU_TAKEN(patch.sku ?? current.sku);
      throw err;
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'part.updated',
      targetType: 'part',
      targetId: id,
      detail: { changed: Object.keys(patch) },
    });
    return { id };
  });
}
