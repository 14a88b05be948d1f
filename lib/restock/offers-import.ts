import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { InvalidError } from '@/lib/errors';
import { importFields } from '@/lib/inventory/csv';
import { inTransaction } from '@/lib/inventory/tx';
import { spaceClock } from '@/lib/sales/periods';
import { checkOffersImport, offersToCsv, type OfferImportCheck, type OfferImportContext } from './offers-csv';
import { requireBuyer } from './suppliers';

// The offers CSV (lib/restock/offers-csv.ts) against the database: export every offer, preview an import
// row by row, or commit it all in one transaction with its audit row (one bad row refuses the whole file).
// Stewards and admins only, like every read of suppliers and prices.

async function importContext(db: Db, ctx: Ctx, lock = false): Promise<OfferImportContext> {
  const [{ currency }, suppliers, parts] = await Promise.all([
    spaceClock(db, ctx.spaceId),
    scoped(db, ctx).selectFrom('suppliers').select(['id', 'name']).$if(lock, (q) => q.forUpdate()).execute(),
    scoped(db, ctx).selectFrom('parts').select(['id', 'sku', 'sale_unit', 'tracking']).where('archived_at', 'is', null).execute(),
  ]);
  return {
    currency,
    suppliers: new Map(suppliers.map((s) => [s.name.toLowerCase(), s.id])),
    parts: new Map(parts.map((p) => [p.sku, p.id])),
    units: new Map(parts.map((p) => [p.id, p.tracking === 'unit' ? 'each' : p.sale_unit])),
  };
}

export async function exportOffersCsv(db: Db, ctx: Ctx): Promise<string> {
  requireBuyer(ctx);
  const [{ currency }, offers] = await Promise.all([
    spaceClock(db, ctx.spaceId),
    scoped(db, ctx)
      .selectFrom('supplier_offers')
      .innerJoin('suppliers', 'suppliers.id', 'supplier_offers.supplier_id')
      .innerJoin('parts', 'parts.id', 'supplier_offers.part_id')
      .select([
        'suppliers.name as supplier',
        'parts.sku',
        'parts.name as part',
        'supplier_offers.item_ref',
        'supplier_offers.pack_size',
        'supplier_offers.pack_price_minor',
        'supplier_offers.preferred',
      ])
      .orderBy('suppliers.name')
      .orderBy('parts.sku')
      .execute(),
  ]);
  return offersToCsv(
    offers.map((o) => ({
      supplier: o.supplier,
      sku: o.sku,
      part: o.part,
      itemRef: o.item_ref,
      packSize: Number(o.pack_size),
      packPriceMinor: o.pack_price_minor,
      preferred: o.preferred,
    })),
    currency,
  );
}

export async function previewOffersImport(db: Db, ctx: Ctx, csv: string): Promise<OfferImportCheck> {
  requireBuyer(ctx);
  return checkOffersImport(csv, await importContext(db, ctx));
}

/** Adds or replaces each supplier's offer for each part; a preferred row unmarks that part's other offers. */
export async function commitOffersImport(db: Db, ctx: Ctx, csv: string) {
  requireBuyer(ctx);
  return inTransaction(db, async (trx) => {
    const check = checkOffersImport(csv, await importContext(trx, ctx, true));
    if (check.errors.length)
      throw new InvalidError(
        `${check.errors.length} problem${check.errors.length === 1 ? '' : 's'} in the file; nothing was imported.`,
        importFields(check.errors),
      );
    const before = await scoped(trx, ctx).selectFrom('supplier_offers').select(['supplier_id', 'part_id']).execute();
    const existing = new Set(before.map((o) => `${o.supplier_id}:${o.part_id}`));
    let added = 0;
    let replaced = 0;
    for (const r of check.rows) {
      if (r.preferred)
        await scoped(trx, ctx)
          .updateTable('supplier_offers')
          .set({ preferred: false })
          .where('part_id', '=', r.partId)
          .where('supplier_id', '<>', r.supplierId)
          .where('preferred', '=', true)
          .execute();
      const values = { item_ref: r.itemRef, pack_size: r.packSize, pack_price_minor: r.packPriceMinor, preferred: r.preferred };
      await scoped(trx, ctx)
        .insertInto('supplier_offers')
        .values({ space_id: ctx.spaceId, supplier_id: r.supplierId, part_id: r.partId, ...values })
        .onConflict((oc) => oc.columns(['space_id', 'supplier_id', 'part_id']).doUpdateSet(values))
        .execute();
      if (existing.has(`${r.supplierId}:${r.partId}`)) replaced++;
      else added++;
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'supplier.offers_imported',
      targetType: 'space',
      targetId: ctx.spaceId,
      detail: { added, replaced, rows: check.rows.length },
    });
    return { added, replaced, rows: check.rows.length };
  });
}
