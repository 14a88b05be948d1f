import { randomUUID } from 'node:crypto';
import { PDFDocument } from 'pdf-lib';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeLocation, makePart, makeSpace, makeStock, makeUnit, makeUser, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// Restocking through real HTTP on the real PostgreSQL: the to-order list against hand-worked figures,
// an order list built, sent past the budget (an admin's approval), mailed with its CSV, received in
// parts (one transaction; a double click; two stewards at once) and called off keeping what arrived.

const db = testDb();
let spaceId: string;
let steward: HttpSession;
let steward2: HttpSession;
let admin: HttpSession;
let member: HttpSession;
let bin: { id: string };
const supplierMail = `orders-${randomUUID().slice(0, 8)}@copperleaf.example`;
const ids: Record<string, string> = {};

async function stockOf(partId: string): Promise<number> {
  const r = await db.selectFrom('stock').select((eb) => eb.fn.sum<string>('qty').as('n')).where('part_id', '=', partId).executeTakeFirst();
  return Number(r?.n ?? 0);
}
async function json<T = Record<string, unknown>>(res: Response): Promise<T> {
  return (await res.json()) as T;
}

beforeAll(async () => {
  const space = await makeSpace(db, { currency: 'USD', timeZone: 'UTC' });
  spaceId = space.id;
  const s = await makeUser(db, spaceId, ['steward'], 'Order steward');
  const s2 = await makeUser(db, spaceId, ['steward'], 'Second steward');
  const a = await makeUser(db, spaceId, ['admin'], 'Budget admin');
  const m = await makeUser(db, spaceId, ['member'], 'Curious member');
  [steward, steward2, admin, member] = await Promise.all([s, s2, a, m].map((u) => signedIn(u.email, u.password)));
  bin = await makeLocation(db, spaceId);

  // Parts and their figures (the hand-worked examples below use these numbers).
  const solder = await makePart(db, spaceId, { name: 'Solder spool', reorderPoint: 10, priceMinor: 900 });
  await makeStock(db, spaceId, solder.id, bin.id, 3);
  const sleeve = await makePart(db, spaceId, { name: 'Sleeve pack', reorderPoint: 0, priceMinor: 50 });
  await makeStock(db, spaceId, sleeve.id, bin.id, 5);
  const supply = await makePart(db, spaceId, { name: 'Bench supply', tracking: 'unit', category: 'supply', reorderPoint: 2 });
  await makeUnit(db, spaceId, supply.id, bin.id); // one on the shelf
  for (let i = 0; i < 3; i++) {
    const out = await makeUnit(db, spaceId, supply.id, null);
    await db.updateTable('units').set({ state: 'out' }).where('id', '=', out.id).execute();
    const waiter = await makeUser(db, spaceId, ['member'], `Waiting member ${i}`);
    await db.insertInto('holds').values({ space_id: spaceId, user_id: waiter.id, unit_id: out.id }).execute();
  }
  const plenty = await makePart(db, spaceId, { name: 'Plenty of fuses', reorderPoint: 5 });
  await makeStock(db, spaceId, plenty.id, bin.id, 9);
  // 90 sleeves sold ten days ago: a rate of 1 a day over the last 90 days.
  const sale = await db
    .insertInto('sales')
    .values({ space_id: spaceId, method: 'cash', status: 'paid', currency: 'USD', total_minor: 4500, paid_at: new Date(Date.now() - 10 * 86_400_000) })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('sale_lines').values({ space_id: spaceId, sale_id: sale.id, part_id: sleeve.id, qty: 90, unit_price_minor: 50 }).execute();
  Object.assign(ids, { solder: solder.id, sleeve: sleeve.id, supply: supply.id, plenty: plenty.id });
}, 120_000);
afterAll(closeTestDb);

describe('suppliers and offers', () => {
  test('a steward adds suppliers and offers; a member sees neither (403)', async () => {
    const c = await steward.post('/api/suppliers', { name: 'Copperleaf Supply', email: supplierMail, leadDays: 10, minOrderMinor: 2000 });
    expect(c.status).toBe(201);
    ids.copperleaf = (await json<{ supplier: { id: string } }>(c)).supplier.id;
    const d = await steward.post('/api/suppliers', { name: 'Amberline Parts', email: 'sales@amberline.example', leadDays: 14 });
    ids.amberline = (await json<{ supplier: { id: string } }>(d)).supplier.id;
    const dup = await steward.post('/api/suppliers', { name: 'copperleaf supply' });
    expect(dup.status).toBe(409);
    expect((await json<{ error: { fields: Record<string, string[]> } }>(dup)).error.fields.name).toBeTruthy();
    const bad = await steward.post('/api/suppliers', { name: 'X', leadDays: 1.5 });
    expect(bad.status).toBe(400);
    expect((await json<{ error: { fields: Record<string, string[]> } }>(bad)).error.fields.leadDays).toBeTruthy();

    for (const [supplierId, partId, packSize, packPriceMinor] of [
      [ids.copperleaf, ids.solder, 5, 1200],
      [ids.copperleaf, ids.sleeve, 10, 300],
      [ids.amberline, ids.supply, 1, 4500],
      [ids.amberline, ids.solder, 5, 1500],
    ] as const) {
      const r = await steward.post('/api/suppliers/offers', { supplierId, partId, packSize, packPriceMinor, itemRef: `REF-${packSize}`, preferred: supplierId === ids.copperleaf || partId === ids.supply });
      expect(r.status).toBe(200);
    }
    expect((await member.get('/api/suppliers')).status).toBe(403);
    expect((await member.get('/api/orders/to-order')).status).toBe(403);
  });
});

describe('what to order, worked by hand', () => {
  test('reorder point, pack rounding, holds and the 90-day sales projection', async () => {
    const r = await steward.get('/api/orders/to-order');
    expect(r.status).toBe(200);
    type G = { supplierName: string; totalMinor: number; lines: { partId: string; short: number; packs: number; units: number; lineTotalMinor: number; reasons: string[]; leadDemand: number; unmetHolds: number }[] };
    const body = await json<{ groups: G[]; totalMinor: number; lineCount: number }>(r);
    const line = (id: string) => body.groups.flatMap((g) => g.lines).find((l) => l.partId === id);
    // Solder: 3 on hand, reorder at 10, preferred offer packs of 5 at 12.00 → short 7 → 2 packs = 24.00.
    expect(line(ids.solder)).toMatchObject({ short: 7, packs: 2, units: 10, lineTotalMinor: 2400, reasons: ['below'] });
    // Sleeves: reorder at 0, 5 on hand, 90 sold in 90 days, Copperleaf's lead time 10 days →
    // D = ceil(90 × 10 / 90) = 10 (daily demand × lead time — common practice (no source)), short 10 − 5 = 5 → 1 pack of 10 = 3.00.
    expect(line(ids.sleeve)).toMatchObject({ leadDemand: 10, short: 5, packs: 1, units: 10, lineTotalMinor: 300, reasons: ['sales'] });
    // Bench supply: 1 on the shelf, 3 members waiting → 2 unmet; reorder at 2 → short 2 + 2 − 1 = 3 → 3 × 45.00.
    expect(line(ids.supply)).toMatchObject({ unmetHolds: 2, short: 3, packs: 3, lineTotalMinor: 13500, reasons: ['below', 'holds'] });
    expect(line(ids.plenty)).toBeUndefined();
    expect(body.groups.map((g) => [g.supplierName, g.totalMinor])).toEqual([
      ['Amberline Parts', 13500],
      ['Copperleaf Supply', 2700],
    ]);
    expect(body.totalMinor).toBe(16200);
  });
});

describe('an order list from draft to arrival', () => {
  test('build, adjust, drop a line; sending past the budget needs an admin’s approval; the mail carries the CSV', async () => {
    const c = await steward.post('/api/orders', {
      supplierId: ids.copperleaf,
      lines: [
        { partId: ids.solder, packs: 2 },
        { partId: ids.sleeve, packs: 1 },
      ],
    });
    expect(c.status).toBe(201);
    ids.order = (await json<{ order: { id: string } }>(c)).order.id;
    const notOffered = await steward.post('/api/orders', { supplierId: ids.copperleaf, lines: [{ partId: ids.supply, packs: 1 }] });
    expect(notOffered.status).toBe(400);
    expect(Object.keys((await json<{ error: { fields: Record<string, string[]> } }>(notOffered)).error.fields)).toEqual(['lines.0.partId']);

    const p = await steward.post(`/api/orders/${ids.order}`, { lines: [{ partId: ids.solder, packs: 3 }] }, 'PATCH');
    expect(p.status).toBe(200);
    const patched = (await json<{ order: { totalMinor: number; lines: unknown[] } }>(p)).order;
    expect(patched.lines).toHaveLength(1);
    expect(patched.totalMinor).toBe(3600); // 3 packs × 12.00

    expect((await steward.post('/api/settings/restocking', { monthlyBudgetMinor: 3000 }, 'PATCH')).status).toBe(403);
    expect((await admin.post('/api/settings/restocking', { monthlyBudgetMinor: 3000 }, 'PATCH')).status).toBe(200);
    const refused = await steward.post(`/api/orders/${ids.order}/send`, {});
    expect(refused.status).toBe(409);
    expect((await json<{ error: { fields: Record<string, string[]> } }>(refused)).error.fields.approvalNote).toBeTruthy();
    expect((await db.selectFrom('order_lists').select('state').where('id', '=', ids.order).executeTakeFirstOrThrow()).state).toBe('draft');
    expect((await steward.post(`/api/orders/${ids.order}/approve`, { note: 'solder is urgent' })).status).toBe(403);
    expect((await admin.post(`/api/orders/${ids.order}/approve`, { note: 'solder is urgent' })).status).toBe(200);

    const sent = await steward.post(`/api/orders/${ids.order}/send`, {});
    expect(sent.status).toBe(200);
    expect((await json<{ order: { state: string } }>(sent)).order.state).toBe('sent');
    const mail = await waitForMessage({ to: supplierMail, timeoutMs: 10_000 });
    expect(mail.text).toContain('3 × pack of 5: Solder spool');
    const csv = mail.attachments?.find((a) => a.filename.endsWith('.csv'));
    expect(csv?.text?.split('\r\n')[0]).toBe(
      'line,your reference,our SKU,description,packs,pack size,units,price per pack (minor units),line total (minor units),currency',
    );
    expect(csv?.text).toContain(',3,5,15,1200,3600,USD');
    const pdf = await steward.get(`/api/orders/${ids.order}/pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get('content-type')).toBe('application/pdf');
    const bytes = Buffer.from(await pdf.arrayBuffer());
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    expect((await PDFDocument.load(bytes)).getTitle()).toBe('Order list to Copperleaf Supply');
    expect((await member.get(`/api/orders/${ids.order}/pdf`)).status).toBe(403);
    const audit = await db.selectFrom('audit_log').select('action').where('target_id', '=', ids.order).execute();
    expect(audit.map((a) => a.action).sort()).toEqual(['order.approved', 'order.created', 'order.sent', 'order.updated']);
    // Now on order: the solder no longer shows in what to order (3 + 15 on order ≥ 10).
    const again = await json<{ groups: { lines: { partId: string }[] }[] }>(await steward.get('/api/orders/to-order'));
    expect(again.groups.flatMap((g) => g.lines).map((l) => l.partId)).not.toContain(ids.solder);
  });

  test('receiving is one transaction: a bin that is not there, found after the receipt and line were written, leaves nothing', async () => {
    const order = (await json<{ order: { lines: { id: string }[] } }>(await steward.get(`/api/orders/${ids.order}`))).order;
    ids.line = order.lines[0].id;
    const r = await steward.post(`/api/orders/${ids.order}/receive`, {
      idempotencyKey: `k-${randomUUID()}`,
      lines: [{ lineId: ids.line, units: 2, receivedBefore: 0, locationId: randomUUID() }],
    });
    expect(r.status).toBe(404);
    const stray = await steward.post(`/api/orders/${ids.order}/receive`, {
      idempotencyKey: `k-${randomUUID()}`,
      lines: [{ lineId: randomUUID(), units: 1, receivedBefore: 0 }],
    });
    expect(stray.status).toBe(400);
    expect(Object.keys((await json<{ error: { fields: Record<string, string[]> } }>(stray)).error.fields)).toEqual(['lines.0.lineId']);
    expect(await stockOf(ids.solder)).toBe(3);
    expect((await db.selectFrom('order_lines').select('received_units').where('id', '=', ids.line).executeTakeFirstOrThrow()).received_units).toBe(0);
    expect(await db.selectFrom('order_receipts').select('id').where('order_id', '=', ids.order).execute()).toHaveLength(0);
  });

  test('a part of it arrives at a different price: stock, line, state, receipt and audit together', async () => {
    const r = await steward.post(`/api/orders/${ids.order}/receive`, {
      idempotencyKey: `k-${randomUUID()}`,
      lines: [{ lineId: ids.line, units: 6, receivedBefore: 0, locationId: bin.id, packPriceMinor: 1300 }],
    });
    expect(r.status).toBe(200);
    const got = await json<{ state: string; costMinor: number }>(r);
    // 6 units × 13.00 per pack of 5 = 15.60, exact in cents (rounding half up is not needed here).
    expect(got).toMatchObject({ state: 'part_in', costMinor: 1560 });
    expect(await stockOf(ids.solder)).toBe(9);
    const moves = await db.selectFrom('stock_movements').select(['qty_delta', 'ref_type', 'ref_id']).where('part_id', '=', ids.solder).where('reason', '=', 'receive').execute();
    expect(moves).toEqual([{ qty_delta: 6, ref_type: 'order_list', ref_id: ids.order }]);
  });

  test('a double click is one receipt: the same key twice at once adds stock once', async () => {
    const key = `k-${randomUUID()}`;
    const body = { idempotencyKey: key, lines: [{ lineId: ids.line, units: 4, receivedBefore: 6, locationId: bin.id }] };
    const [a, b] = await Promise.all([steward.post(`/api/orders/${ids.order}/receive`, body), steward.post(`/api/orders/${ids.order}/receive`, body)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    const [ra, rb] = [await json<{ receiptId: string; replayed: boolean; costMinor: number }>(a), await json<{ receiptId: string; replayed: boolean }>(b)];
    expect(ra.receiptId).toBe(rb.receiptId);
    expect([ra.replayed, rb.replayed].sort()).toEqual([false, true]);
    expect(ra.costMinor).toBe(960); // 4 × 12.00 / 5
    expect(await stockOf(ids.solder)).toBe(13);
  });

  test('two stewards receiving the same delivery at once: one gets it, the other a 409, no double stock', async () => {
    const line = { lineId: ids.line, units: 5, receivedBefore: 10, locationId: bin.id };
    const [a, b] = await Promise.all([
      steward.post(`/api/orders/${ids.order}/receive`, { idempotencyKey: `k-${randomUUID()}`, lines: [line] }),
      steward2.post(`/api/orders/${ids.order}/receive`, { idempotencyKey: `k-${randomUUID()}`, lines: [line] }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await stockOf(ids.solder)).toBe(18);
    const order = await db.selectFrom('order_lists').select('state').where('id', '=', ids.order).executeTakeFirstOrThrow();
    expect(order.state).toBe('all_in');
    const late = await steward.post(`/api/orders/${ids.order}/receive`, { idempotencyKey: `k-${randomUUID()}`, lines: [{ ...line, receivedBefore: 15 }] });
    expect(late.status).toBe(409);
  });

  test('calling off a part-arrived list keeps what arrived; new units are labelled through the same service', async () => {
    const c = await admin.post('/api/orders', { supplierId: ids.amberline, lines: [{ partId: ids.supply, packs: 3 }] });
    const id = (await json<{ order: { id: string } }>(c)).order.id;
    // Past the budget already (36.00 committed of 30.00): an admin sends it with a note.
    const sent = await admin.post(`/api/orders/${id}/send`, { approvalNote: 'members are waiting' });
    expect(sent.status).toBe(200);
    const lines = (await json<{ order: { lines: { id: string }[] } }>(sent)).order.lines;
    const before = await db.selectFrom('units').select('id').where('part_id', '=', ids.supply).execute();
    const r = await steward.post(`/api/orders/${id}/receive`, {
      idempotencyKey: `k-${randomUUID()}`,
      lines: [{ lineId: lines[0].id, units: 1, receivedBefore: 0, locationId: bin.id }],
    });
    expect(r.status).toBe(200);
    const got = await json<{ state: string; unitCodes: string[] }>(r);
    expect(got.state).toBe('part_in');
    expect(got.unitCodes).toHaveLength(1);
    const unit = await db.selectFrom('units').select(['state', 'location_id']).where('code', '=', got.unitCodes[0]).executeTakeFirstOrThrow();
    expect(unit).toEqual({ state: 'on_shelf', location_id: bin.id });

    expect((await steward.post(`/api/orders/${id}/cancel`, { note: '' })).status).toBe(400);
    const x = await steward.post(`/api/orders/${id}/cancel`, { note: 'the other two come from elsewhere' });
    expect(x.status).toBe(200);
    expect((await json<{ order: { state: string; lines: { receivedUnits: number }[] } }>(x)).order).toMatchObject({ state: 'called_off', lines: [{ receivedUnits: 1 }] });
    const after = await db.selectFrom('units').select('id').where('part_id', '=', ids.supply).execute();
    expect(after.length).toBe(before.length + 1);
    const again = await steward.post(`/api/orders/${id}/receive`, {
      idempotencyKey: `k-${randomUUID()}`,
      lines: [{ lineId: lines[0].id, units: 1, receivedBefore: 1, locationId: bin.id }],
    });
    expect(again.status).toBe(409);
    // The month's spend: 15.60 + 9.60 + 12.00 of solder and 45.00 for the supply that came = 82.20.
    const budget = await json<{ budget: { receivedMinor: number; committedMinor: number; budgetMinor: number } }>(await admin.get('/api/settings/restocking'));
    expect(budget.budget).toMatchObject({ receivedMinor: 8220, committedMinor: 3600, budgetMinor: 3000 });
    // The treasurer's Books month shows the same spend beside the sales, per category.
    const t = await makeUser(db, spaceId, ['treasurer'], 'Spend treasurer');
    const treasurer = await signedIn(t.email, t.password);
    const month = new Date().toISOString().slice(0, 7);
    const page = await treasurer.get(`/books?month=${month}`);
    expect(page.status).toBe(200);
    const html = (await page.text()).replace(/<!-- -->/g, '');
    expect(html).toContain('Restocking beside sales');
    expect(html).toContain('spent $37.20'); // consumables: 15.60 + 9.60 + 12.00
    expect(html).toContain('spent $45.00'); // supplies
    expect(html).toContain('spent $82.20'); // all categories
  });

  test('the Receive page’s own route answers new units’ codes for a labelled part (one service)', async () => {
    const r = await steward.post('/api/stock/receive', { partId: ids.supply, locationId: bin.id, qty: 2 });
    expect(r.status).toBe(200);
    expect((await json<{ units: { code: string }[] }>(r)).units).toHaveLength(2);
    const counted = await steward.post('/api/stock/receive', { partId: ids.plenty, qty: 2 });
    expect(counted.status).toBe(400);
    expect((await json<{ error: { fields: Record<string, string[]> } }>(counted)).error.fields.locationId).toEqual(['choose a bin']);
  });
});
