import { describe, expect, it } from 'vitest';
import type { Sale } from '@/db/types';
import { refundMetadata } from '@/lib/sales/refunds';
import { testDb } from '../helpers/db';
import {
  movementsOf,
  onShelf,
  payOnFake,
  postEvent,
  saleRow,
  sessionEvent,
  setUpCounterShop,
  waitFor,
} from './sales-fixtures';

// A payment only counts for the checkout session Ohmstead itself opened for the sale, for the sale's
// exact amount and currency. Everything here runs end to end: real checkout sessions on this file's own
// payments fake, paid there, with the fake's signed webhooks delivered to the app over HTTP (each event
// three times, shuffled out of order). A refused event changes nothing and is listed for the treasurer.

const db = testDb();
const t = setUpCounterShop({ chaos: { duplicate: 3, shuffle: true } });

type Investigate = { eventId: string; type: string; objectId: string | null; saleId: string | null; why: string };

async function startSale(lines: { partId: string; qty: number }[]): Promise<Sale> {
  const res = await t.member.post('/api/sales', { lines });
  expect(res.status).toBe(201);
  const body = (await res.json()) as { sale: { id: string } };
  return saleRow(db, body.sale.id);
}

/** What a member could do at the processor on their own: a session that names our sale, for any money. */
async function foreignSession(sale: Sale, money: { amount: number; currency: string }) {
  const metadata = { saleId: sale.id, spaceId: sale.space_id };
  return t.stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [
      {
        price_data: { currency: money.currency, unit_amount: money.amount, product_data: { name: 'Sleeves' } },
        quantity: 1,
      },
    ],
    success_url: 'http://127.0.0.1:9/done',
    client_reference_id: sale.id,
    metadata,
    payment_intent_data: { metadata },
  });
}

/** Waits until the fake has delivered every copy of every event so far (each answered 2xx). */
const allDelivered = () =>
  waitFor(
    'every webhook delivery to be accepted',
    () => {
      const d = t.fake.deliveries();
      return d.length > 0 && d.every((x) => x.status === 'delivered') ? d : undefined;
    },
    60_000,
  );

async function investigateList(): Promise<Investigate[]> {
  const { timeZone } = await db
    .selectFrom('spaces')
    .select('time_zone as timeZone')
    .where('id', '=', t.shop.space.id)
    .executeTakeFirstOrThrow();
  const month = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit' })
    .format(new Date())
    .slice(0, 7);
  const res = await t.treasurer.get(`/api/books/reconciliation?month=${month}`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { investigate: Investigate[] }).investigate;
}

async function untouched(sale: Sale, shelf: { partId: string; qty: number }) {
  const row = await saleRow(db, sale.id);
  expect(row.status).toBe('pending');
  expect(row.payment_intent_id).toBeNull();
  expect(await movementsOf(db, sale.id)).toEqual([]);
  expect(await onShelf(db, shelf.partId)).toBe(shelf.qty);
}

describe('a payment for a checkout session Ohmstead did not open', () => {
  it.each([
    ['one cent, in the right currency', () => ({ amount: 1, currency: 'usd' })],
    ['the sale’s exact amount and currency', (total: number) => ({ amount: total, currency: 'usd' })],
    ['the sale’s amount in another currency', (total: number) => ({ amount: total, currency: 'eur' })],
  ])('%s: does not pay the sale or move stock, and is listed for the treasurer', async (_n, money) => {
    // A 95-cent sale (one metre of twin lead at 60, one thermal pad at 35).
    const sale = await startSale([
      { partId: t.shop.parts.wire.id, qty: 1 },
      { partId: t.shop.parts.pads.id, qty: 1 },
    ]);
    expect(sale.total_minor).toBe(95);
    const shelf = { partId: t.shop.parts.wire.id, qty: await onShelf(db, t.shop.parts.wire.id) };

    const foreign = await foreignSession(sale, money(sale.total_minor));
    expect((await payOnFake(t.fake, foreign.id)).status).toBe(200);
    await allDelivered();
    await untouched(sale, shelf);

    // Recorded, for this space, and listed in the books as something to look into.
    const recorded = await db
      .selectFrom('payment_events')
      .select(['space_id', 'outcome'])
      .where('object_id', '=', foreign.id)
      .where('type', '=', 'checkout.session.completed')
      .execute();
    expect(recorded).toHaveLength(1);
    expect(recorded[0].space_id).toBe(sale.space_id);
    expect(recorded[0].outcome).toMatch(/^refused/);
    const listed = (await investigateList()).filter((i) => i.objectId === foreign.id);
    expect(listed).toEqual([
      expect.objectContaining({ type: 'checkout.session.completed', saleId: sale.id }),
    ]);
    const books = await (await t.treasurer.get('/books')).text();
    expect(books).toContain('To investigate');
    expect(books).toContain(foreign.id);
    const csv = await (await t.treasurer.get('/api/books/export')).text();
    expect(csv.split('\r\n').find((line) => line.includes(foreign.id))).toMatch(/to investigate/);

    // The genuine session still pays the sale, once, and moves the stock once.
    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    await allDelivered();
    const paid = await saleRow(db, sale.id);
    expect(paid.status).toBe('paid');
    expect(paid.payment_intent_id).not.toBe(foreign.payment_intent);
    expect(await movementsOf(db, sale.id)).toEqual(
      [
        { part_id: t.shop.parts.wire.id, qty_delta: -1, reason: 'sale' },
        { part_id: t.shop.parts.pads.id, qty_delta: -1, reason: 'sale' },
      ].sort((a, b) => a.part_id.localeCompare(b.part_id)),
    );
    expect(await onShelf(db, shelf.partId)).toBe(shelf.qty - 1);
    const paidAudits = await db
      .selectFrom('audit_log')
      .select('id')
      .where('action', '=', 'sale.paid')
      .where('target_id', '=', sale.id)
      .execute();
    expect(paidAudits).toHaveLength(1);
  });

  it('an expiry of a foreign session does not end the sale', async () => {
    const sale = await startSale([{ partId: t.shop.parts.shrink.id, qty: 1 }]);
    const foreign = await foreignSession(sale, { amount: sale.total_minor, currency: 'usd' });
    await t.stripe.checkout.sessions.expire(foreign.id);
    await allDelivered();
    expect((await saleRow(db, sale.id)).status).toBe('pending');
  });
});

describe('the session Ohmstead opened, for an amount or currency other than the sale’s', () => {
  // The sale row is changed after its session was opened, so the processor's (genuine, signed) events
  // carry money that differs from what the sale says: the processor and our books disagree.
  it.each([
    ['a wrong amount', { total_minor: 36 }],
    ['a wrong currency', { currency: 'EUR' }],
  ])('%s: refused by the webhook and by a status check, nothing moves', async (_n, change) => {
    const sale = await startSale([{ partId: t.shop.parts.pads.id, qty: 1 }]);
    const shelf = { partId: t.shop.parts.pads.id, qty: await onShelf(db, t.shop.parts.pads.id) };
    await db.updateTable('sales').set(change).where('id', '=', sale.id).execute();

    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    await allDelivered();
    await untouched(sale, shelf);
    const completed = await db
      .selectFrom('payment_events')
      .select('outcome')
      .where('object_id', '=', sale.checkout_session_id)
      .where('type', '=', 'checkout.session.completed')
      .executeTakeFirstOrThrow();
    expect(completed.outcome).toMatch(/^refused/);

    // Asking the processor directly (the status page's "check again") reaches the same verdict.
    const check = await t.member.post(`/api/sales/${sale.id}/settle`, {});
    expect(check.status).toBe(200);
    expect(((await check.json()) as { sale: { status: string } }).sale.status).toBe('pending');
    await untouched(sale, shelf);
    // Listed once for the treasurer, however often it was asked about.
    expect((await investigateList()).filter((i) => i.saleId === sale.id)).toHaveLength(1);
  });

  it('a signed event naming the right session with the wrong money is refused too', async () => {
    const sale = await startSale([{ partId: t.shop.parts.shrink.id, qty: 2 }]);
    const shelf = { partId: t.shop.parts.shrink.id, qty: await onShelf(db, t.shop.parts.shrink.id) };
    for (const over of [{ amount_total: 1 }, { currency: 'jpy' }]) {
      const event = sessionEvent('checkout.session.completed', sale, over);
      const res = await postEvent(JSON.stringify(event));
      expect(res.status).toBe(200);
      expect(((await res.json()) as { outcome: string }).outcome).toMatch(/^refused/);
    }
    await untouched(sale, shelf);
  });
});

describe('a refund the processor made on a payment that is not the sale’s', () => {
  it('is not booked on the sale and puts nothing back on the shelf', async () => {
    const sale = await startSale([{ partId: t.shop.parts.wire.id, qty: 2 }]);
    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    await allDelivered();
    const paid = await saleRow(db, sale.id);
    expect(paid.status).toBe('paid');
    const shelf = await onShelf(db, t.shop.parts.wire.id);
    const [line] = await db.selectFrom('sale_lines').select('id').where('sale_id', '=', sale.id).execute();

    const foreign = await foreignSession(sale, { amount: 1, currency: 'usd' });
    const pay = await payOnFake(t.fake, foreign.id);
    const foreignPi = (pay.json.payment_intent as { id: string }).id;
    await t.stripe.refunds.create({
      payment_intent: foreignPi,
      amount: 1,
      metadata: refundMetadata({
        saleId: sale.id,
        spaceId: sale.space_id,
        by: t.shop.people.member.id,
        restock: true,
        lines: [{ saleLineId: line.id, qty: 2 }],
      }),
    });
    await allDelivered();
    expect((await saleRow(db, sale.id)).status).toBe('paid');
    const refunds = await db.selectFrom('refunds').select('id').where('sale_id', '=', sale.id).execute();
    expect(refunds).toEqual([]);
    expect(await onShelf(db, t.shop.parts.wire.id)).toBe(shelf);
  });
});
