import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { findPart } from './scope';
import { keySpec } from './specs';

/** Everything the part page shows: specs, units with states, stock per bin, history, attachments. */
export async function getPartDetail(db: Db, ctx: Pick<Ctx, 'spaceId'>, partId: string, historyLimit = 100) {
  const part = await findPart(db, ctx, partId);
  const [stock, units, movements, attachments, space] = await Promise.all([
    scoped(db, ctx)
      .selectFrom('stock')
      .innerJoin('locations', 'locations.id', 'stock.location_id')
      .select([
        'stock.location_id as locationId',
        'locations.name as locationName',
        'locations.code as locationCode',
        'stock.qty',
        'stock.updated_at as updatedAt',
      ])
      .where('stock.part_id', '=', part.id)
      .orderBy('locations.name')
      .execute(),
    scoped(db, ctx)
      .selectFrom('units')
      .leftJoin('locations', 'locations.id', 'units.location_id')
      .leftJoin('kit_boxes', 'kit_boxes.id', 'units.kit_box_id')
      .select([
        'units.id',
        'units.code',
        'units.serial',
        'units.state',
        'units.notes',
        'units.location_id as locationId',
        'locations.name as locationName',
        'units.kit_box_id as kitBoxId',
        'kit_boxes.name as kitBoxName',
        'units.created_at as createdAt',
      ])
      .where('units.part_id', '=', part.id)
      .orderBy('units.serial')
      .orderBy('units.created_at')
      .execute(),
    scoped(db, ctx)
      .selectFrom('stock_movements as m')
      .leftJoin('locations', 'locations.id', 'm.location_id')
      .leftJoin('users', 'users.id', 'm.actor_id')
      .leftJoin('units', 'units.id', 'm.unit_id')
      .select([
        'm.id',
        'm.created_at as at',
        'm.qty_delta as delta',
        'm.reason',
        'm.note',
        'm.ref_type as refType',
        'm.ref_id as refId',
        'locations.name as locationName',
        'users.name as actorName',
        'units.code as unitCode',
      ])
      .where('m.part_id', '=', part.id)
      .where('m.space_id', '=', ctx.spaceId)
      .orderBy('m.created_at', 'desc')
      .orderBy('m.id', 'desc')
      .limit(historyLimit)
      .execute(),
    scoped(db, ctx)
      .selectFrom('attachments')
      .select(['id', 'filename', 'mime', 'size_bytes as sizeBytes', 'created_at as createdAt'])
      .where('part_id', '=', part.id)
      .where('space_id', '=', ctx.spaceId)
      .orderBy('created_at', 'desc')
      .execute(),
    db
      .selectFrom('spaces')
      .select(['currency', 'time_zone'])
      .where('id', '=', ctx.spaceId)
      .executeTakeFirstOrThrow(),
  ]);
  const onHand =
    part.tracking === 'counted'
      ? stock.reduce((s, r) => s + r.qty, 0)
      : units.filter((u) => u.state === 'on_shelf').length;
  return {
    part: {
      id: part.id,
      sku: part.sku,
      name: part.name,
      category: part.category,
      tracking: part.tracking,
      code: part.code,
      specs: part.specs,
      keySpec: keySpec(part.category, part.specs),
      sellable: part.sellable,
      lendable: part.lendable,
      priceMinor: part.price_minor,
      saleUnit: part.sale_unit,
      reorderPoint: part.reorder_point,
      notes: part.notes,
      archived: part.archived_at !== null,
      createdAt: part.created_at,
      updatedAt: part.updated_at,
    },
    onHand,
    below: part.tracking === 'counted' && part.reorder_point > 0 && onHand < part.reorder_point,
    stock,
    units,
    movements,
    attachments,
    currency: space.currency.trim(),
    timeZone: space.time_zone,
  };
}

export type PartDetail = Awaited<ReturnType<typeof getPartDetail>>;
