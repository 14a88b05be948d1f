import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeLocation, makePart, makeStock, testDb } from '../helpers/db';
import { errorOf } from './auth-fixtures';
import { onShelf, saleRow, setUpCounterShop } from './sales-fixtures';

// Units of measure (issue 13, migration 0014) through real HTTP on the real PostgreSQL: wire counted,
// sold and ordered by the metre, solder by the gram, and whole items still whole. Money is USD cents
// (ISO 4217: two minor digits); a line's amount is round(qty × unit price), half away from zero.

const db = testDb();
const t = setUpCounterShop();
const ids: Record<string, string> = {};

beforeAll(async () => {
  const spaceId = t.shop.space.id;
  const bin = await makeLocation(db, spaceId, `Wire reels ${randomUUID().slice(0, 6)}`);
  const wire = await makePart(db, spaceId, { name: 'Twin lead by the metre', category: 'wire', priceMinor: 160 });
  const solder = await makePart(db, spaceId, { name: 'Solder off the spool', priceMinor: 14 });
  await db.updateTable('parts').set({ sale_unit: 'metre' }).where('id', '=', wire.id).execute();
  await db.updateTable('parts').set({ sale_unit: 'gram' }).where('id', '=', solder.id).execute();
  await makeStock(db, spaceId, wire.id, bin.id, 40);
  await makeStock(db, spaceId, solder.id, bin.id, 400);
  Object.assign(ids, { bin: bin.id, wire: wire.id, solder: solder.id });
});

const fieldsOf = async (res: Response) => (await errorOf(res)).fields ?? {};

describe('a count in metres', () => {
  it('posts 65.5 m and the bin then holds 65.5', async () => {
    const opened = await t.steward.post('/api/stock/counts', { locationId: ids.bin });
    expect(opened.status).toBeLessThan(300);
    const { id } = (await opened.json()) as { id: string };
    const typed = await t.steward.post(`/api/stock/counts/${id}`, { lines: [{ partId: ids.wire, counted: 65.5 }] }, 'PATCH');
    expect(typed.status).toBe(200);
    const view = (await (await t.steward.get(`/api/stock/counts/${id}`)).json()) as {
      lines: { partId: string; counted: number; current: number; variance: number; measure: string }[];
    };
    expect(view.lines.find((l) => l.partId === ids.wire)).toMatchObject({ counted: 65.5, current: 40, variance: 25.5, measure: 'metre' });
    expect((await t.steward.post(`/api/stock/counts/${id}/post`)).status).toBe(200);

    const row = await db.selectFrom('stock').select('qty').where('part_id', '=', ids.wire).where('location_id', '=', ids.bin).executeTakeFirstOrThrow();
    expect(row.qty).toBe(65.5);
    const move = await db
      .selectFrom('stock_movements')
      .select(['qty_delta', 'reason'])
      .where('part_id', '=', ids.wire)
      .where('ref_id', '=', id)
      .executeTakeFirstOrThrow();
    expect(move).toEqual({ qty_delta: 25.5, reason: 'count' });
  });

  it('refuses 0.0005 m and 1.5 of a whole-item part, naming the line, and keeps what was typed before', async () => {
    const opened = (await (await t.steward.post('/api/stock/counts', { locationId: ids.bin })).json()) as { id: string };
    const tooFine = await t.steward.post(`/api/stock/counts/${opened.id}`, { lines: [{ partId: ids.wire, counted: 0.0005 }] }, 'PATCH');
    expect(tooFine.status).toBe(400);
    expect((await fieldsOf(tooFine))['lines.0.counted']?.[0]).toMatch(/at most 3 decimals/);
    const halfPad = await t.steward.post(
      `/api/stock/counts/${opened.id}`,
      { lines: [{ partId: ids.wire, counted: 60 }, { partId: t.shop.parts.pads.id, counted: 1.5 }] },
      'PATCH',
    );
    expect(halfPad.status).toBe(400);
    expect((await fieldsOf(halfPad))['lines.1.counted']?.[0]).toMatch(/whole number/);
    // Nothing of the refused request was kept: the wire line has no count yet.
    const view = (await (await t.steward.get(`/api/stock/counts/${opened.id}`)).json()) as { lines: { partId: string; counted: number | null }[] };
    expect(view.lines.find((l) => l.partId === ids.wire)?.counted ?? null).toBeNull();
    expect((await t.steward.post(`/api/stock/counts/${opened.id}`, undefined, 'DELETE')).status).toBe(200);
  });
});

describe('selling by the metre and the gram', () => {
  it('2.5 m at 160 per metre is a 400 cash sale, and 2.5 m leave the shelf', async () => {
    const before = await onShelf(db, ids.wire);
    const res = await t.steward.post('/api/sales/cash', { lines: [{ partId: ids.wire, qty: 2.5 }] });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string; totalMinor: number } };
    // 2.5 × 160 = 400 exactly.
    expect(sale.totalMinor).toBe(400);
    const line = await db.selectFrom('sale_lines').select(['qty', 'unit_price_minor']).where('sale_id', '=', sale.id).executeTakeFirstOrThrow();
    expect(line).toEqual({ qty: 2.5, unit_price_minor: 160 });
    expect(await onShelf(db, ids.wire)).toBe(before - 2.5);
  });

  it('a card sale of 12.5 g at 14 per gram charges 175 on the pay page (12.5 × 14 = 175)', async () => {
    const res = await t.member.post('/api/sales', { lines: [{ partId: ids.solder, qty: 12.5 }] });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string; totalMinor: number } };
    expect(sale.totalMinor).toBe(175);
    const row = await saleRow(db, sale.id);
    const session = await t.stripe.checkout.sessions.retrieve(row.checkout_session_id!);
    expect(session.amount_total).toBe(175);
  });

  it('rounds a line half away from zero: 0.125 m at 160 is 20, 1.003 m is 160.48 → 160', async () => {
    const a = await t.member.post('/api/sales/honour-box', { lines: [{ partId: ids.wire, qty: 0.125 }] });
    expect(a.status).toBe(201);
    expect(((await a.json()) as { sale: { totalMinor: number } }).sale.totalMinor).toBe(20);
    const b = await t.member.post('/api/sales/honour-box', { lines: [{ partId: ids.wire, qty: 1.003 }] });
    expect(((await b.json()) as { sale: { totalMinor: number } }).sale.totalMinor).toBe(160);
  });

  it('0.0005 m and 1.5 of a whole-item part are 400s naming the line; nothing is sold', async () => {
    const before = await db.selectFrom('sales').select('id').where('space_id', '=', t.shop.space.id).execute();
    const tooFine = await t.member.post('/api/sales', { lines: [{ partId: ids.wire, qty: 0.0005 }] });
    expect(tooFine.status).toBe(400);
    expect(await fieldsOf(tooFine)).toHaveProperty(['lines.0.qty']);
    const half = await t.steward.post('/api/sales/cash', {
      lines: [
        { partId: ids.wire, qty: 1 },
        { partId: t.shop.parts.pads.id, qty: 1.5 },
      ],
    });
    expect(half.status).toBe(400);
    expect((await fieldsOf(half))['lines.1.qty']?.[0]).toMatch(/whole number/);
    const after = await db.selectFrom('sales').select('id').where('space_id', '=', t.shop.space.id).execute();
    expect(after.length).toBe(before.length);
  });

  it('the counter lists prices per metre and per gram, and stock in the unit', async () => {
    const { items } = (await (await t.member.get('/api/sales/catalog')).json()) as {
      items: { id: string; saleUnit: string; onShelf: number }[];
    };
    expect(items.find((i) => i.id === ids.wire)?.saleUnit).toBe('metre');
    expect(items.find((i) => i.id === ids.solder)).toMatchObject({ saleUnit: 'gram', onShelf: 400 });
  });

  it('refunds 1.25 m of a 2.5 m line: 1.25 × 160 = 200 back and 1.25 m onto the shelf', async () => {
    const { sale } = (await (await t.steward.post('/api/sales/cash', { lines: [{ partId: ids.wire, qty: 2.5 }] })).json()) as {
      sale: { id: string };
    };
    const line = await db.selectFrom('sale_lines').select('id').where('sale_id', '=', sale.id).executeTakeFirstOrThrow();
    const before = await onShelf(db, ids.wire);
    const res = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, { lines: [{ saleLineId: line.id, qty: 1.25 }], restock: true });
    expect(res.status).toBeLessThan(300);
    const refund = await db.selectFrom('refunds').select('amount_minor').where('sale_id', '=', sale.id).executeTakeFirstOrThrow();
    expect(refund.amount_minor).toBe(200);
    expect(await onShelf(db, ids.wire)).toBe(before + 1.25);
  });
});

describe('ordering and receiving by the metre', () => {
  it('an order line of 12.5 m received adds 12.5 m to the bin', async () => {
    const supplier = (await (
      await t.steward.post('/api/suppliers', { name: `Reel supplier ${randomUUID().slice(0, 6)}`, email: 'reels@reels.example' })
    ).json()) as { supplier?: { id: string }; id?: string };
    const supplierId = supplier.supplier?.id ?? supplier.id!;
    const offer = await t.steward.post('/api/suppliers/offers', { supplierId, partId: ids.wire, packSize: 12.5, packPriceMinor: 1500, preferred: true });
    expect(offer.status).toBeLessThan(300);
    const tooFineOffer = await t.steward.post('/api/suppliers/offers', { supplierId, partId: ids.solder, packSize: 0.0005, packPriceMinor: 1 });
    expect(tooFineOffer.status).toBe(400);
    expect(await fieldsOf(tooFineOffer)).toHaveProperty('packSize');
    const halfPack = await t.steward.post('/api/suppliers/offers', { supplierId, partId: t.shop.parts.pads.id, packSize: 1.5, packPriceMinor: 100 });
    expect(halfPack.status).toBe(400);
    expect((await fieldsOf(halfPack)).packSize?.[0]).toMatch(/whole number/);

    const created = (await (await t.steward.post('/api/orders', { supplierId, lines: [{ partId: ids.wire, packs: 1 }] })).json()) as {
      order?: { id: string };
      id?: string;
    };
    const orderId = created.order?.id ?? created.id!;
    expect((await t.steward.post(`/api/orders/${orderId}/send`, {})).status).toBe(200);
    const { order } = (await (await t.steward.get(`/api/orders/${orderId}`)).json()) as {
      order: { lines: { id: string; orderedUnits: number; saleUnit: string }[] };
    };
    expect(order.lines[0]).toMatchObject({ orderedUnits: 12.5, saleUnit: 'metre' });

    const before = await onShelf(db, ids.wire);
    const got = await t.steward.post(`/api/orders/${orderId}/receive`, {
      idempotencyKey: `units-${randomUUID()}`,
      lines: [{ lineId: order.lines[0].id, units: 12.5, receivedBefore: 0, locationId: ids.bin }],
    });
    expect(got.status).toBe(200);
    // 12.5 m of a 12.5 m pack at 1500: the whole pack's price.
    expect((await got.json()) as object).toMatchObject({ state: 'all_in', costMinor: 1500 });
    expect(await onShelf(db, ids.wire)).toBe(before + 12.5);
    const line = await db.selectFrom('order_lines').select('received_units').where('id', '=', order.lines[0].id).executeTakeFirstOrThrow();
    expect(line.received_units).toBe(12.5);
  });

  it('receiving 1.5 of a whole-item part is a 400 naming the line’s units', async () => {
    const res = await t.steward.post('/api/stock/receive', { partId: t.shop.parts.pads.id, locationId: ids.bin, qty: 1.5 });
    expect(res.status).toBe(400);
    expect((await fieldsOf(res)).qty?.[0]).toMatch(/whole number/);
    const ok = await t.steward.post('/api/stock/receive', { partId: ids.solder, locationId: ids.bin, qty: 0.25 });
    expect(ok.status).toBeLessThan(300);
  });

  it('a write-off of 0.75 m is a movement of −0.75', async () => {
    const res = await t.steward.post('/api/stock/adjust', { partId: ids.wire, locationId: ids.bin, delta: -0.75, reason: 'damaged', note: 'kinked end cut off' });
    expect(res.status).toBeLessThan(300);
    const m = await db
      .selectFrom('stock_movements')
      .select('qty_delta')
      .where('part_id', '=', ids.wire)
      .where('reason', '=', 'damaged')
      .executeTakeFirstOrThrow();
    expect(m.qty_delta).toBe(-0.75);
  });
});

describe('the unit of a part', () => {
  it('a labelled part cannot be counted in metres (400 naming saleUnit)', async () => {
    const res = await t.steward.post('/api/parts', {
      sku: `LBL-${randomUUID().slice(0, 6)}`,
      name: 'Labelled reel',
      category: 'tool',
      tracking: 'unit',
      saleUnit: 'metre',
    });
    expect(res.status).toBe(400);
    expect(await fieldsOf(res)).toHaveProperty('saleUnit');
  });

  it('an unknown unit is a 400 naming saleUnit', async () => {
    const res = await t.steward.post(`/api/parts/${ids.wire}`, { saleUnit: 'furlong' }, 'PATCH');
    expect(res.status).toBe(400);
    expect(await fieldsOf(res)).toHaveProperty('saleUnit');
  });
});
