import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { requireBuyer } from './suppliers';
import { SALES_WINDOW_DAYS, toOrder, type OfferIn, type PartIn, type ToOrder } from './to-order';

// The figures the to-order rule needs, per part of the space, in one query plus the offers:
//   onHand       counted stock over every bin + labelled units on the shelf (as the Shelf counts it)
//   waitingHolds holds still waiting for a unit of the part
//   onOrder      units sent order lists still expect (ordered − received, never below zero)
//   sold90       units sold in the last 90 days, less units refunded, of paid sales

/** Order lists whose lines are still on their way. */
export const OPEN_STATES = ['sent', 'part_in'] as const;

export async function partFigures(db: Db, ctx: Ctx): Promise<PartIn[]> {
  const since = new Date(now().getTime() - SALES_WINDOW_DAYS * 86_400_000);
  const rows = await scoped(db, ctx)
    .selectFrom('parts')
    .select(['parts.id', 'parts.name', 'parts.sku', 'parts.sale_unit', 'parts.reorder_point'])
    .select((eb) => [
      eb
        .selectFrom('stock')
        .select(sql<number>`coalesce(sum(stock.qty), 0)`.as('n'))
        .whereRef('stock.part_id', '=', 'parts.id')
        .as('stockQty'),
      eb
        .selectFrom('units')
        .select(sql<number>`count(*)::int`.as('n'))
        .whereRef('units.part_id', '=', 'parts.id')
        .where('units.state', '=', 'on_shelf')
        .as('shelfUnits'),
      eb
        .selectFrom('holds')
        .innerJoin('units', 'units.id', 'holds.unit_id')
        .select(sql<number>`count(*)::int`.as('n'))
        .whereRef('units.part_id', '=', 'parts.id')
        .where('holds.status', '=', 'waiting')
        .as('waitingHolds'),
      eb
        .selectFrom('order_lines')
        .innerJoin('order_lists', 'order_lists.id', 'order_lines.order_id')
        .select(
          sql<number>`coalesce(sum(greatest(order_lines.packs * order_lines.pack_size - order_lines.received_units, 0)), 0)`.as('n'),
        )
        .whereRef('order_lines.part_id', '=', 'parts.id')
        .where('order_lists.state', 'in', OPEN_STATES)
        .as('onOrder'),
      eb
        .selectFrom('sale_lines')
        .innerJoin('sales', 'sales.id', 'sale_lines.sale_id')
        .select(sql<number>`coalesce(sum(sale_lines.qty - sale_lines.refunded_qty), 0)`.as('n'))
        .whereRef('sale_lines.part_id', '=', 'parts.id')
        .where('sales.status', 'in', ['paid', 'partially_refunded'])
        .where('sales.paid_at', '>=', since)
        .as('sold90'),
    ])
    .where('parts.archived_at', 'is', null)
    .execute();
  const offers = await scoped(db, ctx)
    .selectFrom('supplier_offers')
    .innerJoin('suppliers', 'suppliers.id', 'supplier_offers.supplier_id')
    .select([
      'supplier_offers.id',
      'supplier_offers.part_id',
      'supplier_offers.supplier_id',
      'supplier_offers.item_ref',
      'supplier_offers.pack_size',
      'supplier_offers.pack_price_minor',
      'supplier_offers.preferred',
      'suppliers.name',
      'suppliers.lead_days',
      'suppliers.min_order_minor',
    ])
    .where('suppliers.archived_at', 'is', null)
    .execute();
  const byPart = new Map<string, OfferIn[]>();
  for (const o of offers) {
    const list = byPart.get(o.part_id) ?? [];
    list.push({
      offerId: o.id,
      supplierId: o.supplier_id,
      supplierName: o.name,
      leadDays: o.lead_days,
      minOrderMinor: o.min_order_minor,
      itemRef: o.item_ref,
      packSize: o.pack_size,
      packPriceMinor: o.pack_price_minor,
      preferred: o.preferred,
    });
    byPart.set(o.part_id, list);
  }
  return rows.map((r) => ({
    partId: r.id,
    name: r.name,
    sku: r.sku,
    saleUnit: r.sale_unit,
    onHand: (r.stockQty ?? 0) + (r.shelfUnits ?? 0),
    reorderPoint: r.reorder_point,
    waitingHolds: r.waitingHolds ?? 0,
    onOrder: r.onOrder ?? 0,
    sold90: r.sold90 ?? 0,
    offers: byPart.get(r.id) ?? [],
  }));
}

/** The to-order list of the caller's space, grouped by supplier. */
export async function whatToOrder(db: Db, ctx: Ctx): Promise<ToOrder & { currency: string }> {
  requireBuyer(ctx);
  const [figures, space] = await Promise.all([
    partFigures(db, ctx),
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return { ...toOrder(figures), currency: space.currency.trim() };
}
