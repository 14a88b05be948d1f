import { describe, expect, it } from 'vitest';
import { monthOf, shiftMonth } from '@/lib/sales/periods';
import { testDb } from '../helpers/db';
import { errorOf } from './auth-fixtures';
import { onShelf, payOnFake, saleRow, setUpCounterShop, waitFor } from './sales-fixtures';

// Refunds by the treasurer through the processor (with an idempotency key), full or per line, with
// or without putting the items back; the processor's own refund webhooks arriving as well book
// nothing twice. A closed month never changes: its refunds go in as reversing entries.

const db = testDb();
const t = setUpCounterShop();

async function paidSale(lines: { partId: string; qty: number }[]) {
  const res = await t.member.post('/api/sales', { lines });
  expect(res.status).toBe(201);
  const id = ((await res.json()) as { sale: { id: string } }).sale.id;
  expect((await payOnFake(t.fake, (await saleRow(db, id)).checkout_session_id!)).status).toBe(200);
  await waitFor('the sale to be paid', async () => (await saleRow(db, id)).status === 'paid');
  return saleRow(db, id);
}
const linesOf = (saleId: string) =>
  db
    .selectFrom('sale_lines')
    .selectAll()
    .where('sale_id', '=', saleId)
    .orderBy('unit_price_minor', 'desc')
    .execute();
const refundsOf = (saleId: string) =>
  db.selectFrom('refunds').selectAll().where('sale_id', '=', saleId).orderBy('created_at').execute();
const refundMoves = (refundId: string) =>
  db
    .selectFrom('stock_movements')
    .select(['part_id', 'qty_delta', 'reason'])
    .where('ref_type', '=', 'refund')
    .where('ref_id', '=', refundId)
    .execute();
const deliveriesSettled = () =>
  waitFor('the fake’s webhooks to be delivered', () => {
    const d = t.fake.deliveries();
    return d.every((x) => x.status === 'delivered') ? d : undefined;
  });

describe('refunds', () => {
  it('refunds one line through the processor, puts it back on the shelf, and books it once', async () => {
    const sale = await paidSale([
      { partId: t.shop.parts.shrink.id, qty: 2 },
      { partId: t.shop.parts.pads.id, qty: 4 },
    ]);
    const [shrinkLine] = await linesOf(sale.id);
    const shelfBefore = await onShelf(db, t.shop.parts.shrink.id);

    const res = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {
      lines: [{ saleLineId: shrinkLine.id, qty: 1 }],
      restock: true,
    });
    expect(res.status).toBe(201);
    const { refund } = (await res.json()) as {
      refund: { refundId: string; amountMinor: number; status: string };
    };
    expect(refund).toMatchObject({ amountMinor: 150, status: 'partially_refunded' });

    // The processor refunded exactly that, once.
    const atProcessor = (await t.stripe.refunds.list({ payment_intent: sale.payment_intent_id! })).data;
    expect(atProcessor.map((r) => r.amount)).toEqual([150]);
    // Its refund.created and charge.refunded webhooks come too; still one refund row, one restock.
    await deliveriesSettled();
    const booked = await refundsOf(sale.id);
    expect(booked).toHaveLength(1);
    expect(booked[0]).toMatchObject({
      amount_minor: 150,
      processor_refund_id: atProcessor[0].id,
      restock: true,
    });
    expect(await refundMoves(booked[0].id)).toEqual([
      { part_id: t.shop.parts.shrink.id, qty_delta: 1, reason: 'refund' },
    ]);
    expect(await onShelf(db, t.shop.parts.shrink.id)).toBe(shelfBefore + 1);
    expect((await linesOf(sale.id))[0].refunded_qty).toBe(1);
  });

  it('refuses more than is left on a line, naming it', async () => {
    const sale = await paidSale([{ partId: t.shop.parts.wire.id, qty: 2 }]);
    const [line] = await linesOf(sale.id);
    const res = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {
      lines: [{ saleLineId: line.id, qty: 3 }],
    });
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields).toHaveProperty(['lines.0.qty']);
    expect(await refundsOf(sale.id)).toEqual([]);
  });

  it('refunds everything left without restocking, then has nothing more to refund', async () => {
    const sale = await paidSale([
      { partId: t.shop.parts.wire.id, qty: 3 },
      { partId: t.shop.parts.pads.id, qty: 2 },
    ]);
    const [wireLine] = await linesOf(sale.id);
    expect(
      (
        await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {
          lines: [{ saleLineId: wireLine.id, qty: 1 }],
        })
      ).status,
    ).toBe(201);
    const shelf = await onShelf(db, t.shop.parts.wire.id);
    const rest = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {});
    expect(rest.status).toBe(201);
    expect(((await rest.json()) as { refund: { amountMinor: number; status: string } }).refund).toEqual(
      expect.objectContaining({ amountMinor: 2 * 60 + 2 * 35, status: 'refunded' }),
    );
    expect(await onShelf(db, t.shop.parts.wire.id)).toBe(shelf); // not restocked
    const again = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {});
    expect(again.status).toBe(409);
    const processorTotal = (
      await t.stripe.refunds.list({ payment_intent: sale.payment_intent_id! })
    ).data.reduce((s, r) => s + r.amount, 0);
    expect(processorTotal).toBe(sale.total_minor);
  });
});

describe('a closed month', () => {
  it('cannot be closed before it ends, and is closed once', async () => {
    const thisMonth = monthOf(new Date(), 'UTC');
    const early = await t.treasurer.post('/api/books/periods', { month: thisMonth });
    expect(early.status).toBe(400);
    expect((await errorOf(early)).fields).toHaveProperty('month');
    const bad = await t.treasurer.post('/api/books/periods', { month: '2026-13' });
    expect(bad.status).toBe(400);
    expect((await t.member.post('/api/books/periods', { month: shiftMonth(thisMonth, -1) })).status).toBe(
      403,
    );
  });

  it('keeps its sales unchanged: a refund goes in as a reversing entry dated in the open month', async () => {
    const sale = await paidSale([{ partId: t.shop.parts.shrink.id, qty: 2 }]);
    // As if paid last month (its money moved then), and last month then closed by the treasurer.
    const lastMonth = shiftMonth(monthOf(new Date(), 'UTC'), -1);
    await db
      .updateTable('sales')
      .set({
        paid_at: new Date(`${lastMonth}-15T12:00:00Z`),
        created_at: new Date(`${lastMonth}-15T11:58:00Z`),
      })
      .where('id', '=', sale.id)
      .execute();
    let close = await t.treasurer.post('/api/books/periods', { month: lastMonth });
    if (close.status === 409) {
      // The moved sale's money shows at the processor this month: a row nobody has explained yet, so the
      // close names how many and takes a confirmation of exactly that many.
      const asked = (await errorOf(close)).fields?.confirmUnresolved?.[0] ?? '';
      const n = Number(/Send (\d+)/.exec(asked)?.[1]);
      expect(n).toBeGreaterThan(0);
      close = await t.treasurer.post('/api/books/periods', { month: lastMonth, confirmUnresolved: n });
    }
    expect(close.status).toBe(201);
    expect((await t.treasurer.post('/api/books/periods', { month: lastMonth })).status).toBe(409);

    const before = await saleRow(db, sale.id);
    const [line] = await linesOf(sale.id);
    const res = await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {
      lines: [{ saleLineId: line.id, qty: 1 }],
      restock: true,
    });
    expect(res.status).toBe(201);
    await deliveriesSettled();

    // The original is exactly as it was.
    expect(await saleRow(db, sale.id)).toEqual(before);
    expect((await linesOf(sale.id))[0].refunded_qty).toBe(0);
    // The reversing entry carries the refund, dated now.
    const reversals = await db
      .selectFrom('sales')
      .selectAll()
      .where('reverses_sale_id', '=', sale.id)
      .execute();
    expect(reversals).toHaveLength(1);
    expect(reversals[0]).toMatchObject({ status: 'reversed', total_minor: 150, method: 'card' });
    expect(monthOf(reversals[0].created_at, 'UTC')).toBe(monthOf(new Date(), 'UTC'));
    const booked = await refundsOf(reversals[0].id);
    expect(booked).toHaveLength(1);
    expect(await linesOf(reversals[0].id)).toEqual([
      expect.objectContaining({ part_id: t.shop.parts.shrink.id, qty: 1, unit_price_minor: 150 }),
    ]);

    // What is left to refund counts the reversal: one more unit, then nothing.
    expect(
      (await t.treasurer.post(`/api/sales/${sale.id}/refunds`, { lines: [{ saleLineId: line.id, qty: 2 }] }))
        .status,
    ).toBe(400);
    expect((await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {})).status).toBe(201);
    expect((await t.treasurer.post(`/api/sales/${sale.id}/refunds`, {})).status).toBe(409);
    expect(await saleRow(db, sale.id)).toEqual(before);
  });
});
