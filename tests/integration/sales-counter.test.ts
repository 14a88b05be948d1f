import { describe, expect, it } from 'vitest';
import { waitForMessage } from '@/lib/mail/mailbox';
import { makePart, testDb } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { errorOf, session, staffedSpace } from './auth-fixtures';
import { movementsOf, onShelf, payOnFake, saleRow, setUpCounterShop, waitFor } from './sales-fixtures';

// The counter's routes through real HTTP: who may do what, every bad input a 4xx naming its field,
// prices from the database only, cash sales, receipts by e-mail, and sales of other spaces invisible.

const db = testDb();
const t = setUpCounterShop();

describe('who may sell', () => {
  it('answers 401 to nobody and 403 to a role without the counter', async () => {
    const anonymous = await new HttpSession().post('/api/sales', {
      lines: [{ partId: t.shop.parts.pads.id, qty: 1 }],
    });
    expect(anonymous.status).toBe(401);
    const byTreasurer = await t.treasurer.post('/api/sales', {
      lines: [{ partId: t.shop.parts.pads.id, qty: 1 }],
    });
    expect(byTreasurer.status).toBe(403);
    const cashByMember = await t.member.post('/api/sales/cash', {
      lines: [{ partId: t.shop.parts.pads.id, qty: 1 }],
    });
    expect(cashByMember.status).toBe(403);
    const refundByMember = await t.member.post(`/api/sales/${crypto.randomUUID()}/refunds`, {});
    expect(refundByMember.status).toBe(403);
  });

  it('lets only a steward sell on someone else’s behalf, and only to a member of the space', async () => {
    const forOther = await t.member.post('/api/sales', {
      lines: [{ partId: t.shop.parts.pads.id, qty: 1 }],
      buyerId: t.shop.people.buyer2.id,
    });
    expect(forOther.status).toBe(403);
    const outsider = await staffedSpace(db);
    const notHere = await t.steward.post('/api/sales', {
      lines: [{ partId: t.shop.parts.pads.id, qty: 1 }],
      buyerId: outsider.people.member.id,
    });
    expect(notHere.status).toBe(400);
    expect((await errorOf(notHere)).fields).toHaveProperty('buyerId');
  });
});

describe('bad baskets get a 4xx naming the field', () => {
  const cases: [string, () => unknown, number, string][] = [
    ['no body', () => undefined, 400, '(body)'],
    ['an empty basket', () => ({ lines: [] }), 400, 'lines'],
    ['a zero quantity', () => ({ lines: [{ partId: t.shop.parts.pads.id, qty: 0 }] }), 400, 'lines.0.qty'],
    [
      'a fractional quantity',
      () => ({ lines: [{ partId: t.shop.parts.pads.id, qty: 1.5 }] }),
      400,
      'lines.0.qty',
    ],
    [
      'a part id that is not an id',
      () => ({ lines: [{ partId: 'heat-shrink', qty: 1 }] }),
      400,
      'lines.0.partId',
    ],
    ['an unknown part', () => ({ lines: [{ partId: crypto.randomUUID(), qty: 1 }] }), 400, 'lines.0.partId'],
    [
      'more than the shelf holds',
      () => ({
        lines: [
          { partId: t.shop.parts.pads.id, qty: 1 },
          { partId: t.shop.parts.shrink.id, qty: 21 },
        ],
      }),
      409,
      'lines.1.qty',
    ],
  ];
  it.each(cases)('%s', async (_name, body, status, field) => {
    const res = await t.member.post('/api/sales', body() as object);
    expect(res.status).toBe(status);
    expect(Object.keys((await errorOf(res)).fields ?? {})).toContain(field);
  });

  it('treats another space’s part and a part not for sale as unknown here', async () => {
    const other = await staffedSpace(db);
    const theirs = await makePart(db, other.space.id, { priceMinor: 100 });
    const notForSale = await makePart(db, t.shop.space.id, { name: 'Bench meter', category: 'meter' });
    for (const partId of [theirs.id, notForSale.id]) {
      const res = await t.member.post('/api/sales', { lines: [{ partId, qty: 1 }] });
      expect(res.status).toBe(400);
      expect((await errorOf(res)).fields).toHaveProperty(['lines.0.partId']);
    }
  });

  it('takes prices from the database, never from the request', async () => {
    const res = await t.member.post('/api/sales', {
      lines: [{ partId: t.shop.parts.wire.id, qty: 2, unitPriceMinor: 1 }],
      totalMinor: 2,
    });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string; totalMinor: number } };
    expect(sale.totalMinor).toBe(2 * 60);
    expect((await saleRow(db, sale.id)).total_minor).toBe(120);
  });
});

describe('a card sale end to end', () => {
  it('pays through the processor and mails the buyer a receipt', async () => {
    const res = await t.member.post('/api/sales', {
      lines: [
        { partId: t.shop.parts.shrink.id, qty: 1 },
        { partId: t.shop.parts.pads.id, qty: 4 },
      ],
    });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string } };
    const row = await saleRow(db, sale.id);
    expect((await payOnFake(t.fake, row.checkout_session_id!)).status).toBe(200);
    const paid = await waitFor('the sale to be paid', async () => {
      const view = await t.member.get(`/api/sales/${sale.id}`);
      const body = (await view.json()) as { sale: { status: string; lines: unknown[] } };
      return body.sale.status === 'paid' ? body.sale : undefined;
    });
    expect(paid.lines).toHaveLength(2);
    const receipt = await waitForMessage({
      to: t.shop.people.member.email,
      timeoutMs: 15_000,
      match: (m) => m.text.includes(sale.id),
    });
    expect(receipt.subject).toMatch(/^Receipt /);
    expect(receipt.text).toContain('$2.90'); // 150 + 4 × 35 = 290 cents, USD exponent 2 (ISO 4217)
  });
});

describe('seeing sales', () => {
  it('shows a sale to its buyer, the steward and the treasurer, and 404 to anyone else', async () => {
    const res = await t.member.post('/api/sales', { lines: [{ partId: t.shop.parts.pads.id, qty: 1 }] });
    const { sale } = (await res.json()) as { sale: { id: string } };
    for (const who of [t.member, t.steward, t.treasurer])
      expect((await who.get(`/api/sales/${sale.id}`)).status).toBe(200);
    const other = await session(t.shop.people.buyer2);
    expect((await other.get(`/api/sales/${sale.id}`)).status).toBe(404);
    const elsewhere = await staffedSpace(db);
    expect((await (await session(elsewhere.people.treasurer)).get(`/api/sales/${sale.id}`)).status).toBe(404);
    expect((await t.member.get('/api/sales/not-a-sale')).status).toBe(404);
  });
});

describe('cash into the honour box', () => {
  it('is paid at once, moves the stock and mails the buyer a receipt', async () => {
    const before = await onShelf(db, t.shop.parts.wire.id);
    const res = await t.steward.post('/api/sales/cash', {
      lines: [{ partId: t.shop.parts.wire.id, qty: 3 }],
      buyerId: t.shop.people.buyer2.id,
    });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string; status: string; totalMinor: number } };
    expect(sale).toMatchObject({ status: 'paid', totalMinor: 180 });
    const row = await saleRow(db, sale.id);
    expect(row).toMatchObject({
      method: 'cash',
      status: 'paid',
      buyer_id: t.shop.people.buyer2.id,
      cashier_id: t.shop.people.steward.id,
    });
    expect(await movementsOf(db, sale.id)).toEqual([
      { part_id: t.shop.parts.wire.id, qty_delta: -3, reason: 'sale' },
    ]);
    expect(await onShelf(db, t.shop.parts.wire.id)).toBe(before - 3);
    const receipt = await waitForMessage({
      to: t.shop.people.buyer2.email,
      timeoutMs: 15_000,
      match: (m) => m.text.includes(sale.id),
    });
    expect(receipt.text).toMatch(/in cash/);
  });

  it('refuses more than the shelf holds and changes nothing', async () => {
    const before = await onShelf(db, t.shop.parts.wire.id);
    const res = await t.steward.post('/api/sales/cash', {
      lines: [{ partId: t.shop.parts.wire.id, qty: before + 1 }],
    });
    expect(res.status).toBe(409);
    expect((await errorOf(res)).fields).toHaveProperty(['lines.0.qty']);
    expect(await onShelf(db, t.shop.parts.wire.id)).toBe(before);
  });
});
