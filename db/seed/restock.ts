import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { DEMO_PARTS } from './parts';

// Quillmere's restocking, invented like the rest of the demo: three suppliers (no real firms), an offer
// for every part they would sell us, a monthly budget, one order list part arrived and one with the
// supplier past its expected day.

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
}
