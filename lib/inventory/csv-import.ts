import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { InvalidError } from '@/lib/errors';
import { issueCode } from './codes';
import { checkImport, importFields, type ImportCheck, type ImportContext } from './csv';
import { addToBin, recordMovement } from './stock';
import { inTransaction } from './tx';
import { insertUnits } from './units';

/** The space as the import sees it: its currency, parts by SKU, bins by code and by name. */
async function importContext(db: Db, ctx: Pick<Ctx, 'spaceId'>, lock = false): Promise<ImportContext> {
  const [space, parts, locations] = await Promise.all([
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
    scoped(db, ctx)
      .selectFrom('parts')
      .select(['id', 'sku', 'category', 'tracking', 'specs', 'sale_unit'])
      .where('space_id', '=', ctx.spaceId)
      .$if(lock, (qb) => qb.forUpdate())
      .execute(),
    scoped(db, ctx).selectFrom('locations').select(['id', 'code', 'name']).where('space_id', '=', ctx.spaceId).execute(),
  ]);
  const locs = new Map<string, string>();
  for (const l of locations) {
    locs.set(l.name.toLowerCase(), l.id);
    if (l.code) locs.set(l.code, l.id);
  }
  return { currency: space.currency.trim(), parts: new Map(parts.map((p) => [p.sku, p])), locations: locs };
}

/** Row-by-row check, nothing written. */
export async function previewImport(db: Db, ctx: Pick<Ctx, 'spaceId'>, csv: string): Promise<ImportCheck> {
  return checkImport(csv, await importContext(db, ctx));
}

/**
 * All or nothing: the rows are checked again inside the transaction (against the parts as they are
 * now, locked), and one bad row refuses the whole file with every error named `rows.<row>.<field>`.
 */
export async function commitImport(db: Db, ctx: Ctx, csv: string) {
  return inTransaction(db, async (trx) => {
    const check = checkImport(csv, await importContext(trx, ctx, true));
    if (check.errors.length) {
      throw new InvalidError(
        `${check.errors.length} problem${check.errors.length === 1 ? '' : 's'} in the file; nothing was imported.`,
        importFields(check.errors),
      );
    }
    let created = 0;
    let updated = 0;
    let received = 0;
    for (const r of check.rows) {
      let partId = r.partId;
      if (r.action === 'create') {
        partId = randomUUID();
        const code = await issueCode(trx, ctx.spaceId, 'part', partId);
        await scoped(trx, ctx)
          .insertInto('parts')
          .values({
            id: partId,
            space_id: ctx.spaceId,
            sku: r.sku,
            name: r.name!,
            category: r.category,
            tracking: r.tracking,
            specs: JSON.stringify(r.specs ?? {}),
            code,
            sellable: r.sellable ?? false,
            lendable: r.lendable ?? r.category !== 'consumable',
            price_minor: r.priceMinor ?? null,
            sale_unit: r.saleUnit ?? 'each',
            reorder_point: r.reorderPoint ?? 0,
            notes: r.notes ?? '',
          })
          .execute();
        created++;
      } else {
        await scoped(trx, ctx)
          .updateTable('parts')
          .set({
            updated_at: now(),
            ...(r.name !== undefined ? { name: r.name } : {}),
            ...(r.specs !== undefined ? { specs: JSON.stringify(r.specs), category: r.category } : {}),
            ...(r.reorderPoint !== undefined ? { reorder_point: r.reorderPoint } : {}),
            ...(r.priceMinor !== undefined ? { price_minor: r.priceMinor } : {}),
            ...(r.saleUnit !== undefined ? { sale_unit: r.saleUnit } : {}),
            ...(r.sellable !== undefined ? { sellable: r.sellable } : {}),
            ...(r.lendable !== undefined ? { lendable: r.lendable } : {}),
            ...(r.notes !== undefined ? { notes: r.notes } : {}),
          })
          .where('id', '=', partId!)
          .execute();
        updated++;
      }
      if (r.qty && r.qty > 0) {
        if (r.tracking === 'unit') {
          await insertUnits(trx, ctx, { id: partId!, sku: r.sku }, r.qty, r.locationId ?? null);
        } else {
          await addToBin(trx, ctx, partId!, r.locationId!, r.qty);
          await recordMovement(trx, ctx, {
            partId: partId!,
            locationId: r.locationId!,
            delta: r.qty,
            reason: 'receive',
            note: `CSV import, row ${r.row}`,
          });
        }
        received += r.qty;
      }
    }
    // A bought-in part list with a sellable line and no price slips past the row check only for existing parts.
    const unpriced = await scoped(trx, ctx)
      .selectFrom('parts')
      .select('sku')
      .where('space_id', '=', ctx.spaceId)
      .where('sellable', '=', true)
      .where('price_minor', 'is', null)
      .where(
        'sku',
        'in',
        check.rows.map((r) => r.sku),
      )
      .executeTakeFirst();
    if (unpriced) {
      const row = check.rows.find((r) => r.sku === unpriced.sku)!.row;
      throw new InvalidError('A part on sale needs a price; nothing was imported.', {
        [`rows.${row}.price`]: ['a part on sale needs a price'],
      });
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'parts.imported',
      targetType: 'space',
      targetId: ctx.spaceId,
      detail: { created, updated, received, rows: check.rows.length },
    });
    return { created, updated, received, rows: check.rows.length };
  });
}
