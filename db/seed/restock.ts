import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { monthOf, monthRange, shiftMonth } from '@/lib/sales/periods';
import { DEMO_PARTS } from './parts';

// Quillmere's restocking, invented like the rest of the demo: three suppliers (no real firms), an offer
// for every part they would sell us, a monthly budget, one order list part arrived and one with the
// supplier past its expected day. In the demo month (last month) one list arrived in full at a price a little
// below today's offers, and a bin count and a crushed pack were written off, so the month's books have
// purchases, write-offs at cost and margins costed both ways (offer before the delivery, price paid after).

const DAY = 86_400_000;

const SUPPLIERS = [
  { key: 'tallow', name: 'Tallowmere Components', email: 'orders@tallowmere.example', website: 'https://tallowmere.example', lead: 7, min: 5000, notes: 'Free delivery over $50. Ask for Ines.' },
  { key: 'brindle', name: 'Brindlecote Bench Supply', email: 'sales@brindlecote.example', website: 'https://brindlecote.example', lead: 12, min: 0, notes: 'Slow but cheap on optics and heat sinks.' },
  { key: 'sallow', name: 'Sallowbrook Wire and Sundries', email: 'counter@sallowbrook.example', website: '', lead: 5, min: 2000, notes: 'Wire by the 25 m reel.' },
] as const;
type Key = (typeof SUPPLIERS)[number]['key'];

/** Who sells what, in what packs; the first supplier listed is the preferred one. */
function offersFor(sku: string, category: string): { key: Key; pack: number }[] {
  if (category === 'wire') return [{ key: 'sallow', pack: 25 }];
  if (category === 'led') return [{ key: 'tallow', pack: 10 }, { key: 'brindle', pack: 20 }];
  if (category === 'heat_sink' || sku === 'CON-LENS30') return [{ key: 'brindle', pack: 5 }, { key: 'tallow', pack: 5 }];
  if (category === 'driver') return [{ key: 'tallow', pack: sku.startsWith('RES') ? 20 : 2 }];
  if (category === 'supply') return [{ key: 'tallow', pack: 1 }];
  // Solder comes off a 250 g spool (sold by the gram at the counter).
  if (sku === 'CON-SOLDER') return [{ key: 'sallow', pack: 250 }, { key: 'tallow', pack: 500 }];
  if (category === 'consumable' || category === 'kit_box') return [{ key: 'sallow', pack: 10 }, { key: 'tallow', pack: 10 }];
  return [];
}

/** What a pack costs us: about 55 % of the shelf price, or a round figure for parts we do not sell. */
const packPrice = (priceMinor: number | undefined, pack: number, dearer: boolean) =>
  Math.round((priceMinor ? priceMinor * 0.55 : 1500) * pack * (dearer ? 1.1 : 1));

export async function seedRestock(
  trx: Db,
  spaceId: string,
  partIds: Record<string, string>,
  bins: Record<string, string>,
  steward: string,
  clock: Date,
): Promise<void> {
  const supplierIds = {} as Record<Key, string>;
  for (const s of SUPPLIERS) {
    const row = await trx
      .insertInto('suppliers')
      .values({ space_id: spaceId, name: s.name, email: s.email, website: s.website, lead_days: s.lead, min_order_minor: s.min, notes: s.notes })
      .returning('id')
      .executeTakeFirstOrThrow();
    supplierIds[s.key] = row.id;
  }
  const offer: Record<string, { pack: number; price: number }> = {};
  for (const p of DEMO_PARTS) {
    if (!partIds[p.sku]) continue;
    for (const [i, o] of offersFor(p.sku, p.category).entries()) {
      const price = packPrice(p.priceMinor, o.pack, i > 0);
      await trx
        .insertInto('supplier_offers')
        .values({ space_id: spaceId, supplier_id: supplierIds[o.key], part_id: partIds[p.sku], item_ref: `${o.key.toUpperCase().slice(0, 3)}-${p.sku}`, pack_size: o.pack, pack_price_minor: price, preferred: i === 0 })
        .execute();
      if (i === 0) offer[p.sku] = { pack: o.pack, price };
    }
  }
  await trx
    .updateTable('spaces')
    .set({ settings: sql`jsonb_set(settings, '{restocking}', ${JSON.stringify({ monthlyBudgetMinor: 25000 })}::jsonb, true)` })
    .where('id', '=', spaceId)
    .execute();

  // Part arrived: thermal paste and blue stars from Tallowmere, sent 3 days ago; the paste came yesterday.
  const partIn = await trx
    .insertInto('order_lists')
    .values({ space_id: spaceId, supplier_id: supplierIds.tallow, state: 'part_in', currency: 'USD', note: 'Paste first, please.', created_by: steward, created_at: new Date(clock.getTime() - 4 * DAY), sent_at: new Date(clock.getTime() - 3 * DAY), sent_by: steward, expected_at: new Date(clock.getTime() + 4 * DAY) })
    .returning('id')
    .executeTakeFirstOrThrow();
  const paste = offer['CON-TPASTE'] ?? { pack: 10, price: 400 };
  const stars = offer['LED-3W-BL'] ?? { pack: 10, price: 880 };
  const pasteLine = await trx
    .insertInto('order_lines')
    .values({ space_id: spaceId, order_id: partIn.id, part_id: partIds['CON-TPASTE'], item_ref: 'TAL-CON-TPASTE', pack_size: paste.pack, packs: 2, pack_price_minor: paste.price, received_units: 2 * paste.pack })
    .returning('id')
    .executeTakeFirstOrThrow();
  await trx
    .insertInto('order_lines')
    .values({ space_id: spaceId, order_id: partIn.id, part_id: partIds['LED-3W-BL'], item_ref: 'TAL-LED-3W-BL', pack_size: stars.pack, packs: 1, pack_price_minor: stars.price })
    .execute();
  const arrivedAt = new Date(clock.getTime() - 1 * DAY);
  const units = 2 * paste.pack;
  const cost = 2 * paste.price;
  const receipt = await trx
    .insertInto('order_receipts')
    .values({ space_id: spaceId, order_id: partIn.id, idempotency_key: `seed-${partIn.id}`, received_by: steward, received_at: arrivedAt, result: JSON.stringify({ seeded: true }) })
    .returning('id')
    .executeTakeFirstOrThrow();
  await trx
    .insertInto('order_receipt_lines')
    .values({ space_id: spaceId, receipt_id: receipt.id, line_id: pasteLine.id, part_id: partIds['CON-TPASTE'], location_id: bins.consumables, units, cost_minor: cost })
    .execute();
  await trx
    .updateTable('stock')
    .set((eb) => ({ qty: eb('qty', '+', units) }))
    .where('part_id', '=', partIds['CON-TPASTE'])
    .where('location_id', '=', bins.consumables)
    .execute();
  await trx
    .insertInto('stock_movements')
    .values({ space_id: spaceId, part_id: partIds['CON-TPASTE'], location_id: bins.consumables, qty_delta: units, reason: 'receive', note: 'order list', ref_type: 'order_list', ref_id: partIn.id, actor_id: steward, created_at: arrivedAt })
    .execute();

  // Overdue: lenses from Brindlecote, sent 20 days ago with a 12-day lead time.
  const late = await trx
    .insertInto('order_lists')
    .values({ space_id: spaceId, supplier_id: supplierIds.brindle, state: 'sent', currency: 'USD', created_by: steward, created_at: new Date(clock.getTime() - 21 * DAY), sent_at: new Date(clock.getTime() - 20 * DAY), sent_by: steward, expected_at: new Date(clock.getTime() - 8 * DAY) })
    .returning('id')
    .executeTakeFirstOrThrow();
  const lens = offer['CON-LENS30'] ?? { pack: 5, price: 260 };
  await trx
    .insertInto('order_lines')
    .values({ space_id: spaceId, order_id: late.id, part_id: partIds['CON-LENS30'], item_ref: 'BRI-CON-LENS30', pack_size: lens.pack, packs: 2, pack_price_minor: lens.price })
    .execute();
  for (const [id, action, at] of [
    [partIn.id, 'order.sent', 3],
    [partIn.id, 'order.received', 1],
    [late.id, 'order.sent', 20],
  ] as const) {
    await trx
      .insertInto('audit_log')
      .values({ space_id: spaceId, actor_id: steward, action, target_type: 'order_list', target_id: id, detail: JSON.stringify({ seeded: true }), created_at: new Date(clock.getTime() - at * DAY) })
      .execute();
  }
  await seedDemoMonthStock(trx, spaceId, partIds, bins, supplierIds.sallow, steward, clock);
}

/**
 * Last month at Quillmere: thermal pads and lever connectors arrived from Sallowbrook on the 6th (10:00
 * local), a bin count on the 15th found 3 pads fewer than the books held, and a heat-shrink assortment was
 * crushed on the 20th. The opening stock is written that much smaller (or larger), so the shelf today holds
 * exactly what it held before these were added: only the history and the books change.
 */
async function seedDemoMonthStock(
  trx: Db,
  spaceId: string,
  partIds: Record<string, string>,
  bins: Record<string, string>,
  supplierId: string,
  steward: string,
  clock: Date,
): Promise<void> {
  const { time_zone: tz } = await trx.selectFrom('spaces').select('time_zone').where('id', '=', spaceId).executeTakeFirstOrThrow();
  const { from } = monthRange(shiftMonth(monthOf(clock, tz), -1), tz);
  const day = (n: number, hour: number) => new Date(from.getTime() + (n - 1) * DAY + hour * 3_600_000);
  const delivered = [
    { sku: 'CON-TPAD', packs: 10, pack: 10, price: 130 },
    { sku: 'CON-LEVER2', packs: 2, pack: 10, price: 210 },
  ].filter((d) => partIds[d.sku]);
  const writtenOff = [
    { sku: 'CON-TPAD', qty: 3, reason: 'count' as const, at: day(15, 18), note: 'Bin count: 3 fewer than the books held' },
    { sku: 'CON-HSHRINK', qty: 1, reason: 'damaged' as const, at: day(20, 19), note: 'Assortment crushed under a toolbox' },
  ].filter((w) => partIds[w.sku]);
  if (!delivered.length) return;

  const list = await trx
    .insertInto('order_lists')
    .values({ space_id: spaceId, supplier_id: supplierId, state: 'all_in', currency: 'USD', created_by: steward, created_at: day(1, 11), sent_at: day(1, 12), sent_by: steward, expected_at: day(6, 18), closed_at: day(6, 10) })
    .returning('id')
    .executeTakeFirstOrThrow();
  const receipt = await trx
    .insertInto('order_receipts')
    .values({ space_id: spaceId, order_id: list.id, idempotency_key: `seed-${list.id}`, received_by: steward, received_at: day(6, 10), result: JSON.stringify({ seeded: true }) })
    .returning('id')
    .executeTakeFirstOrThrow();
  for (const d of delivered) {
    const units = d.packs * d.pack;
    const line = await trx
      .insertInto('order_lines')
      .values({ space_id: spaceId, order_id: list.id, part_id: partIds[d.sku], item_ref: `SAL-${d.sku}`, pack_size: d.pack, packs: d.packs, pack_price_minor: d.price, received_units: units })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx
      .insertInto('order_receipt_lines')
      .values({ space_id: spaceId, receipt_id: receipt.id, line_id: line.id, part_id: partIds[d.sku], location_id: bins.consumables, units, cost_minor: d.packs * d.price })
      .execute();
    await trx
      .insertInto('stock_movements')
      .values({ space_id: spaceId, part_id: partIds[d.sku], location_id: bins.consumables, qty_delta: units, reason: 'receive', note: 'order list', ref_type: 'order_list', ref_id: list.id, actor_id: steward, created_at: day(6, 10) })
      .execute();
    await openingStockChange(trx, spaceId, partIds[d.sku], -units);
  }
  for (const w of writtenOff) {
    await trx
      .insertInto('stock_movements')
      .values({ space_id: spaceId, part_id: partIds[w.sku], location_id: bins.consumables, qty_delta: -w.qty, reason: w.reason, note: w.note, actor_id: steward, created_at: w.at })
      .execute();
    await openingStockChange(trx, spaceId, partIds[w.sku], w.qty);
  }
  await trx
    .insertInto('audit_log')
    .values([
      { space_id: spaceId, actor_id: steward, action: 'order.sent', target_type: 'order_list', target_id: list.id, detail: JSON.stringify({ seeded: true }), created_at: day(1, 12) },
      { space_id: spaceId, actor_id: steward, action: 'order.received', target_type: 'order_list', target_id: list.id, detail: JSON.stringify({ seeded: true }), created_at: day(6, 10) },
    ])
    .execute();
}

/** Moves a part's opening-stock movement by `delta`, so its history still sums to what is on the shelf. */
async function openingStockChange(trx: Db, spaceId: string, partId: string, delta: number): Promise<void> {
  await trx
    .updateTable('stock_movements')
    .set((eb) => ({ qty_delta: eb('qty_delta', '+', delta) }))
    .where('space_id', '=', spaceId)
    .where('part_id', '=', partId)
    .where('reason', '=', 'receive')
    .where('note', '=', 'opening stock')
    .execute();
}
