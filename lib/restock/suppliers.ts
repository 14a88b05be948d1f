import 'server-only';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { refuseQtyNotInUnit } from '@/lib/inventory/measure-check';
import type { Measure } from '@/lib/inventory/measure';
import { assertId, findPart } from '@/lib/inventory/scope';
import { inTransaction, isUniqueViolation } from '@/lib/inventory/tx';
import type { offerSchema, supplierPatchSchema, supplierSchema } from './schemas';

// A space's suppliers and their offers. Members never see either (nor any price paid): every read here
// refuses anyone who is not a steward or admin, whatever route or page asks.

export function requireBuyer(ctx: Pick<Ctx, 'roles'>): void {
  if (!hasRole(ctx, 'steward', 'admin')) throw new ForbiddenError('Suppliers and orders are for stewards and admins.');
}

export type SupplierRow = {
  id: string;
  name: string;
  website: string;
  email: string;
  leadDays: number;
  minOrderMinor: number;
  notes: string;
  archived: boolean;
  offers: OfferRow[];
};
export type OfferRow = {
  id: string;
  supplierId: string;
  partId: string;
  partName: string;
  partSku: string;
  itemRef: string;
  packSize: number;
  /** The part's unit: a pack of 25 m, of 250 g, or of 10 items. */
  saleUnit: Measure;
  packPriceMinor: number;
  preferred: boolean;
};

const NAME_TAKEN = (name: string) =>
  new ConflictError(`There is already a supplier called “${name}”.`, { name: ['another supplier has this name'] });

export async function findSupplier(db: Db, ctx: Ctx, id: string) {
  requireBuyer(ctx);
  assertId(id, 'supplier');
  const row = await scoped(db, ctx).selectFrom('suppliers').selectAll().where('id', '=', id).executeTakeFirst();
  if (!row) throw new NotFoundError('No such supplier.');
  return row;
}

export async function listSuppliers(db: Db, ctx: Ctx): Promise<SupplierRow[]> {
  requireBuyer(ctx);
  const [suppliers, offers] = await Promise.all([
    scoped(db, ctx).selectFrom('suppliers').selectAll().orderBy('archived_at', 'desc').orderBy('name').execute(),
    scoped(db, ctx)
      .selectFrom('supplier_offers')
      .innerJoin('parts', 'parts.id', 'supplier_offers.part_id')
      .select([
        'supplier_offers.id',
        'supplier_offers.supplier_id',
        'supplier_offers.part_id',
        'supplier_offers.item_ref',
        'supplier_offers.pack_size',
        'supplier_offers.pack_price_minor',
        'supplier_offers.preferred',
        'parts.name as part_name',
        'parts.sku as part_sku',
        'parts.sale_unit',
      ])
      .orderBy('parts.name')
      .execute(),
  ]);
  return suppliers
    .sort((a, b) => Number(a.archived_at !== null) - Number(b.archived_at !== null) || a.name.localeCompare(b.name))
    .map((s) => ({
      id: s.id,
      name: s.name,
      website: s.website,
      email: s.email,
      leadDays: s.lead_days,
      minOrderMinor: s.min_order_minor,
      notes: s.notes,
      archived: s.archived_at !== null,
      offers: offers
        .filter((o) => o.supplier_id === s.id)
        .map((o) => ({
          id: o.id,
          supplierId: o.supplier_id,
          partId: o.part_id,
          partName: o.part_name,
          partSku: o.part_sku,
          itemRef: o.item_ref,
          packSize: o.pack_size,
          saleUnit: o.sale_unit,
          packPriceMinor: o.pack_price_minor,
          preferred: o.preferred,
        })),
    }));
}

export async function createSupplier(db: Db, ctx: Ctx, input: z.output<typeof supplierSchema>) {
  requireBuyer(ctx);
  try {
    return await inTransaction(db, async (trx) => {
      const row = await scoped(trx, ctx)
        .insertInto('suppliers')
        .values({
          space_id: ctx.spaceId,
          name: input.name,
          website: input.website,
          email: input.email,
          lead_days: input.leadDays,
          min_order_minor: input.minOrderMinor,
          notes: input.notes,
        })
        .returning(['id', 'name'])
        .executeTakeFirstOrThrow();
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: 'supplier.created',
        targetType: 'supplier',
        targetId: row.id,
        detail: { name: row.name },
      });
      return { supplier: row };
    });
  } catch (err) {
    if (isUniqueViolation(err, 'suppliers_space_name_uq')) throw NAME_TAKEN(input.name);
    throw err;
  }
}

export async function updateSupplier(db: Db, ctx: Ctx, id: string, patch: z.output<typeof supplierPatchSchema>) {
  requireBuyer(ctx);
  try {
    return await inTransaction(db, async (trx) => {
      await findSupplier(trx, ctx, id);
      const row = await scoped(trx, ctx)
        .updateTable('suppliers')
        .set({
          ...(patch.name !== undefined ? { name: patch.name } : {}),
          ...(patch.website !== undefined ? { website: patch.website } : {}),
          ...(patch.email !== undefined ? { email: patch.email } : {}),
          ...(patch.leadDays !== undefined ? { lead_days: patch.leadDays } : {}),
          ...(patch.minOrderMinor !== undefined ? { min_order_minor: patch.minOrderMinor } : {}),
          ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
          ...(patch.archived !== undefined ? { archived_at: patch.archived ? now() : null } : {}),
        })
        .where('id', '=', id)
        .returning(['id', 'name'])
        .executeTakeFirstOrThrow();
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: 'supplier.updated',
        targetType: 'supplier',
        targetId: id,
        detail: { ...patch },
      });
      return { supplier: row };
    });
  } catch (err) {
    if (isUniqueViolation(err, 'suppliers_space_name_uq')) throw NAME_TAKEN(patch.name ?? '');
    throw err;
  }
}

/** Adds an offer, or replaces the supplier's offer for that part; a preferred offer unmarks the part's others. */
export async function saveOffer(db: Db, ctx: Ctx, input: z.output<typeof offerSchema>) {
  requireBuyer(ctx);
  return inTransaction(db, async (trx) => {
    await findSupplier(trx, ctx, input.supplierId);
    const part = await findPart(trx, ctx, input.partId);
    // A pack of wire may be 12.5 m; a pack of whole items is a whole number of them.
    refuseQtyNotInUnit(input.packSize, part.tracking === 'unit' ? 'each' : part.sale_unit, 'packSize', 'pack size');
    if (input.preferred) {
      await scoped(trx, ctx)
        .updateTable('supplier_offers')
        .set({ preferred: false })
        .where('part_id', '=', input.partId)
        .where('supplier_id', '<>', input.supplierId)
        .where('preferred', '=', true)
        .execute();
    }
    const row = await scoped(trx, ctx)
      .insertInto('supplier_offers')
      .values({
        space_id: ctx.spaceId,
        supplier_id: input.supplierId,
        part_id: input.partId,
        item_ref: input.itemRef,
        pack_size: input.packSize,
        pack_price_minor: input.packPriceMinor,
        preferred: input.preferred,
      })
      .onConflict((oc) =>
        oc.columns(['space_id', 'supplier_id', 'part_id']).doUpdateSet({
          item_ref: input.itemRef,
          pack_size: input.packSize,
          pack_price_minor: input.packPriceMinor,
          preferred: input.preferred,
        }),
      )
      .returning(['id'])
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'supplier.offer_saved',
      targetType: 'supplier',
      targetId: input.supplierId,
      detail: { offerId: row.id, ...input },
    });
    return { offer: { id: row.id, ...input } };
  });
}

export async function deleteOffer(db: Db, ctx: Ctx, id: string) {
  requireBuyer(ctx);
  assertId(id, 'offer');
  return inTransaction(db, async (trx) => {
    const row = await scoped(trx, ctx)
      .deleteFrom('supplier_offers')
      .where('id', '=', id)
      .returning(['id', 'supplier_id', 'part_id'])
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such offer.');
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'supplier.offer_removed',
      targetType: 'supplier',
      targetId: row.supplier_id,
      detail: { offerId: id, partId: row.part_id },
    });
    return { ok: true as const };
  });
}
