import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { monthOf } from '@/lib/sales/periods';
import type { HttpSession } from '../helpers/http';
import { closeTestDb, makeLocation, makePart, makeStock, makeUnit, testDb } from '../helpers/db';
import { session, staffedSpace } from './auth-fixtures';

// Issue 13, the money side left: margins per category on the Books page, write-offs at cost and purchases
// received in the filing file, and the spend CSV — through real HTTP on real PostgreSQL, worked by hand.
// Money in USD cents (ISO 4217: two minor digits). The space is tax-exempt, so sales before tax are what
// was paid. The cost rule (lib/books/unit-cost.ts) values goods at the price per unit last paid on
// receiving before the moment, else the preferred offer's pack price ÷ pack size, else unknown: common
// practice (no source). Rounding: half away from zero to the cent, once per line.

const db = testDb();
type Row = Record<string, string>;
let space: Awaited<ReturnType<typeof staffedSpace>>;
let steward: HttpSession;
let treasurer: HttpSession;
let month: string;
const ids = {} as Record<'bin' | 'pads' | 'lead' | 'mystery' | 'supplier' | 'driver', string>;

/** An order list that arrived in full: one receipt line of `units` for `costMinor`, received at `at`. */
async function received(partId: string, units: number, costMinor: number, at: Date) {
  const s = space.space.id;
  const list = await db
    .insertInto('order_lists')
    .values({ space_id: s, supplier_id: ids.supplier, state: 'all_in', currency: 'USD', sent_at: at, closed_at: at })
    .returning('id')
    .executeTakeFirstOrThrow();
  const line = await db
    .insertInto('order_lines')
    .values({ space_id: s, order_id: list.id, part_id: partId, pack_size: units, packs: 1, pack_price_minor: costMinor, received_units: units })
    .returning('id')
    .executeTakeFirstOrThrow();
  const receipt = await db
    .insertInto('order_receipts')
    .values({ space_id: s, order_id: list.id, idempotency_key: `t-${list.id}`, received_at: at })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('order_receipt_lines')
    .values({ space_id: s, receipt_id: receipt.id, line_id: line.id, part_id: partId, location_id: ids.bin, units, cost_minor: costMinor })
    .execute();
}

const sell = async (lines: { partId: string; qty: number }[]) => {
  const res = await steward.post('/api/sales/cash', { lines });
  expect(res.status).toBe(201);
};

beforeAll(async () => {
  space = await staffedSpace(db, 'Margins test space');
  const s = space.space.id;
  month = monthOf(new Date(), 'UTC');
  ids.bin = (await makeLocation(db, s)).id;
  ids.pads = (await makePart(db, s, { name: 'Star pads', priceMinor: 100 })).id;
  ids.lead = (await makePart(db, s, { name: 'Twin lead, per metre', category: 'wire', priceMinor: 60 })).id;
  ids.mystery = (await makePart(db, s, { name: 'Unpriced grommets', priceMinor: 200 })).id;
  ids.driver = (await makePart(db, s, { name: 'Bench driver', category: 'driver', tracking: 'unit' })).id;
  for (const p of [ids.pads, ids.lead, ids.mystery]) await makeStock(db, s, p, ids.bin, 40);
  ids.supplier = (
    await db.insertInto('suppliers').values({ space_id: s, name: 'Wrenfold Trading', email: 'orders@wrenfold.example' }).returning('id').executeTakeFirstOrThrow()
  ).id;
  const dearer = await db.insertInto('suppliers').values({ space_id: s, name: 'Quayfold Parts' }).returning('id').executeTakeFirstOrThrow();
  await db
    .insertInto('supplier_offers')
    .values([
      // Pads: 10 for 400 (40 each). Lead: a 25 m reel for 1000 (40 a metre). Grommets: no offer at all.
      { space_id: s, supplier_id: ids.supplier, part_id: ids.pads, pack_size: 10, pack_price_minor: 400, preferred: true },
      { space_id: s, supplier_id: ids.supplier, part_id: ids.lead, pack_size: 25, pack_price_minor: 1000, preferred: true },
      // A dearer offer that is not preferred never decides a cost.
      { space_id: s, supplier_id: dearer.id, part_id: ids.lead, pack_size: 25, pack_price_minor: 5000, preferred: false },
    ])
    .execute();
  steward = await session(space.people.steward);
  treasurer = await session(space.people.treasurer);

  // 30 pads received an hour ago for 900 (30 each), then sale A; 10 more arrive for 500 (50 each), then sale B.
  await received(ids.pads, 30, 900, new Date(Date.now() - 3_600_000));
  await sell([{ partId: ids.pads, qty: 2 }]);
  await new Promise((r) => setTimeout(r, 20));
  await received(ids.pads, 10, 500, new Date());
  await new Promise((r) => setTimeout(r, 20));
  await sell([
    { partId: ids.pads, qty: 3 },
    { partId: ids.lead, qty: 2 },
    { partId: ids.mystery, qty: 1 },
  ]);
});

afterAll(closeTestDb);

const booksPage = async () => {
  const res = await treasurer.get(`/books?month=${month}`);
  expect(res.status).toBe(200);
  return res.text();
};
const minorIn = (html: string, pattern: string) => {
  const m = html.match(new RegExp(`${pattern}[^>]*data-minor="(-?\\d+)"`));
  return m ? Number(m[1]) : undefined;
};
/** The cells of one row of the margins table: sold, cost, margin (data-minor) and the % text. */
const marginRow = (html: string, category: string) => {
  const row = html.match(new RegExp(`<tr[^>]*data-category="${category}"[^>]*>(.*?)</tr>`, 's'))?.[1] ?? '';
  const minors = [...row.matchAll(/data-label="(Sold|Cost|Margin)"([^>]*)>/g)].map((m) => {
    const minor = /data-minor="(-?\d+)"/.exec(m[2])?.[1];
    return [m[1], minor === undefined ? null : Number(minor)];
  });
  const pct = row.match(/data-label="Margin %"[^>]*>([^<]*)</)?.[1] ?? '';
  return { ...Object.fromEntries(minors), pct, unknown: /Cost unknown for (\d+) line/.exec(row)?.[1] ?? null, text: row };
};

describe('margins on the Books month', () => {
  it('costs each line at the price last paid before the sale, else the offer, else unknown — by hand', async () => {
    const html = await booksPage();
    // Consumables: A 2 pads at 30 = 60; B 3 pads at 50 = 150; grommets unknown (200 sold, left out).
    // Sold 200 + 300 + 200 = 700; cost 210; margin (500 − 210) = 290; 290 / 500 = 58.0 %.
    expect(marginRow(html, 'consumable')).toMatchObject({ Sold: 700, Cost: 210, Margin: 290, pct: '58.0 %', unknown: '1' });
    // Wire: nothing received, so the preferred offer: 2 × 1000 / 25 = 80; margin 120 − 80 = 40; 33.3 %.
    expect(marginRow(html, 'wire')).toMatchObject({ Sold: 120, Cost: 80, Margin: 40, pct: '33.3 %', unknown: null });
    // All: sold 820, known 620, cost 290, margin 330; 330 / 620 = 53.23 % → 53.2 %.
    expect(marginRow(html, 'all')).toMatchObject({ Sold: 820, Cost: 290, Margin: 330, pct: '53.2 %' });
    // The rule is said on the page.
    expect(html).toContain('the price per unit last');
  });
});

describe('write-offs at cost and purchases received, in the filing file and on the page', () => {
  it('values hand adjustments and a charged damaged unit at cost, leaves unknown costs blank, and ties out', async () => {
    const s = space.space.id;
    // Two pads crushed (last paid 50 each: 100); one grommet lost (no price anywhere: unknown);
    // one metre of lead found (+1: −40 at the offer).
    for (const body of [
      { partId: ids.pads, locationId: ids.bin, delta: -2, reason: 'damaged', note: 'crushed in a drawer' },
      { partId: ids.mystery, locationId: ids.bin, delta: -1, reason: 'lost', note: 'not in the bin' },
      { partId: ids.lead, locationId: ids.bin, delta: 1, reason: 'adjust', note: 'found a metre' },
    ]) {
      const res = await steward.post('/api/stock/adjust', body);
      expect(res.status).toBeLessThan(300);
    }
    // A driver unit a borrower damaged and was charged for (the return retires it, its movement has 0 units),
    // and one damaged without a charge (it waits for repair: not written off). The driver's cost: 1 unit
    // received for 1234.
    await received(ids.driver, 1, 1234, new Date(Date.now() - 1));
    const charged = await makeUnit(db, s, ids.driver);
    const repaired = await makeUnit(db, s, ids.driver);
    const loan = await db
      .insertInto('loans')
      .values({ space_id: s, borrower_id: space.people.member.id, due_at: new Date(), status: 'returned_short' })
      .returning('id')
      .executeTakeFirstOrThrow();
    const lines = await db
      .insertInto('loan_lines')
      .values([
        { space_id: s, loan_id: loan.id, part_id: ids.driver, unit_id: charged.id, qty: 1 },
        { space_id: s, loan_id: loan.id, part_id: ids.driver, unit_id: repaired.id, qty: 1 },
      ])
      .returning(['id', 'unit_id'])
      .execute();
    await db
      .insertInto('charges')
      .values({ space_id: s, user_id: space.people.member.id, loan_id: loan.id, loan_line_id: lines.find((l) => l.unit_id === charged.id)!.id, kind: 'damaged', item: 'Bench driver', amount_minor: 1500, currency: 'USD' })
      .execute();
    await db
      .insertInto('stock_movements')
      .values([charged, repaired].map((u) => ({ space_id: s, part_id: ids.driver, unit_id: u.id, qty_delta: 0, reason: 'damaged' as const, ref_type: 'loan', ref_id: loan.id })))
      .execute();

    const res = await treasurer.get(`/api/books/export?month=${month}&part=filing`);
    expect(res.status).toBe(200);
    const rows = Papa.parse<Row>(await res.text(), { header: true, skipEmptyLines: true }).data;
    const writeOffs = rows.filter((r) => r.section === 'write-off');
    expect(writeOffs.map((r) => [r.item, r.qty, r.amount_minor])).toEqual([
      ['Star pads', '2', '100'],
      ['Unpriced grommets', '1', ''],
      ['Twin lead, per metre', '-1', '-40'],
      ['Bench driver', '1', '1234'],
    ]);
    expect(writeOffs[1].note).toContain('cost unknown');
    for (const r of writeOffs) expect(r.when).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(Z|[+-]\d{2}:\d{2})$/);
    // Purchases received: 900 + 500 + 1234 = 2634, each at the price paid, with its supplier.
    const purchases = rows.filter((r) => r.section === 'purchase received');
    expect(purchases.map((r) => Number(r.amount_minor))).toEqual([900, 500, 1234]);
    expect(purchases.every((r) => r.supplier === 'Wrenfold Trading' && r.currency === 'USD')).toBe(true);

    // Ties out: the sections sum to the totals file and to the Books page's figures.
    const totals = Papa.parse<Row>(await (await treasurer.get(`/api/books/export?month=${month}&part=filing-totals`)).text(), {
      header: true,
      skipEmptyLines: true,
    }).data;
    const figure = (name: string) => Number(totals.find((f) => f.figure === name)?.amount_minor);
    expect(figure('written off at cost')).toBe(100 - 40 + 1234);
    expect(figure('purchases received at the price paid')).toBe(2634);
    const html = await booksPage();
    expect(minorIn(html, 'data-testid="filing-write-offs"')).toBe(1294);
    expect(minorIn(html, 'data-testid="filing-purchases"')).toBe(2634);
    expect(minorIn(html, 'data-testid="spend-total"')).toBe(2634);
    expect(html).toMatch(/1 of them has no known cost/);
  });
});

describe('the spend CSV', () => {
  it('lists each line received at the price paid, on the space’s clock with its offset, for treasurers and admins only', async () => {
    const res = await treasurer.get(`/api/books/spend?month=${month}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    expect(res.headers.get('content-disposition')).toContain(`ohmstead-spend-${month}.csv`);
    const parsed = Papa.parse<Row>(await res.text(), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([
      'received_at', 'month', 'supplier', 'order_list', 'item', 'sku', 'category', 'account_code',
      'units', 'unit', 'pack_size', 'listed_pack_price_minor', 'paid_minor', 'currency', 'received_by',
    ]);
    expect(parsed.data.map((r) => [r.item, r.units, r.unit, r.paid_minor])).toEqual([
      ['Star pads', '30', 'each', '900'],
      ['Star pads', '10', 'each', '500'],
      ['Bench driver', '1', 'each', '1234'],
    ]);
    for (const r of parsed.data) {
      expect(r.received_at).toMatch(/\+00:00$|Z$/); // the space runs on UTC
      expect(r.currency).toBe('USD');
      expect(r.supplier).toBe('Wrenfold Trading');
    }
    const admin = await session(space.people.admin);
    expect((await admin.get(`/api/books/spend?month=${month}`)).status).toBe(200);
    expect((await steward.get(`/api/books/spend?month=${month}`)).status).toBe(403);
    const member = await session(space.people.member);
    expect((await member.get(`/api/books/spend?month=${month}`)).status).toBe(403);
    expect((await treasurer.get('/api/books/spend?month=December')).status).toBe(400);
  });

  it('in another zone, a delivery late on the last evening of a month is that month’s, with the offset', async () => {
    // Chicago is UTC−06:00 in winter: 30 November 21:00 local is 1 December 03:00 UTC.
    const other = await staffedSpace(db, 'Zoned spend space');
    await db.updateTable('spaces').set({ time_zone: 'America/Chicago' }).where('id', '=', other.space.id).execute();
    const bin = await makeLocation(db, other.space.id);
    const part = await makePart(db, other.space.id, { name: 'Cable ties' });
    const sup = await db.insertInto('suppliers').values({ space_id: other.space.id, name: 'Quayside Sundries' }).returning('id').executeTakeFirstOrThrow();
    const at = new Date('2026-12-01T03:00:00Z');
    const list = await db.insertInto('order_lists').values({ space_id: other.space.id, supplier_id: sup.id, state: 'all_in', currency: 'USD', sent_at: at }).returning('id').executeTakeFirstOrThrow();
    const line = await db.insertInto('order_lines').values({ space_id: other.space.id, order_id: list.id, part_id: part.id, pack_size: 5, packs: 1, pack_price_minor: 420, received_units: 5 }).returning('id').executeTakeFirstOrThrow();
    const receipt = await db.insertInto('order_receipts').values({ space_id: other.space.id, order_id: list.id, idempotency_key: `t-${list.id}`, received_at: at }).returning('id').executeTakeFirstOrThrow();
    await db.insertInto('order_receipt_lines').values({ space_id: other.space.id, receipt_id: receipt.id, line_id: line.id, part_id: part.id, location_id: bin.id, units: 5, cost_minor: 420 }).execute();
    const t = await session(other.people.treasurer);
    const nov = Papa.parse<Row>(await (await t.get('/api/books/spend?month=2026-11')).text(), { header: true, skipEmptyLines: true }).data;
    expect(nov.map((r) => [r.received_at, r.paid_minor])).toEqual([['2026-11-30T21:00:00-06:00', '420']]);
    const dec = Papa.parse<Row>(await (await t.get('/api/books/spend?month=2026-12')).text(), { header: true, skipEmptyLines: true }).data;
    expect(dec).toEqual([]);
    // Another space's treasurer sees none of it.
    const mine = Papa.parse<Row>(await (await treasurer.get('/api/books/spend?month=2026-11')).text(), { header: true, skipEmptyLines: true }).data;
    expect(mine.some((r) => r.supplier === 'Quayside Sundries')).toBe(false);
  });
});
