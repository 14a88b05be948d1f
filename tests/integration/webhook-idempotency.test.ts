import { describe, expect, it } from 'vitest';
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

// Each processor event is applied once, whatever the order and however many deliveries. This file's
// own payments fake sends every event ten times, shuffled out of creation order (its chaos switch),
// to the app's real webhook route over HTTP; the sales are real checkout sessions paid on the fake.

const db = testDb();
const t = setUpCounterShop({ chaos: { duplicate: 10, shuffle: true } });

async function startSale(lines: { partId: string; qty: number }[]) {
  const res = await t.member.post('/api/sales', { lines });
  expect(res.status).toBe(201);
  const body = (await res.json()) as { sale: { id: string; status: string }; url: string };
  expect(body.url.startsWith(`${t.fake.url}/pay/`)).toBe(true);
  return saleRow(db, body.sale.id);
}

/** The audit rows of a sale turning paid: one per payment, however many deliveries. */
const paidAudits = (saleId: string) =>
  db
    .selectFrom('audit_log')
    .select('detail')
    .where('action', '=', 'sale.paid')
    .where('target_id', '=', saleId)
    .execute();

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

describe('the same events delivered ten times and out of order', () => {
  it('pay the sale once and move each line off the shelf once', async () => {
    const sale = await startSale([
      { partId: t.shop.parts.shrink.id, qty: 2 },
      { partId: t.shop.parts.pads.id, qty: 3 },
    ]);
    expect(sale.status).toBe('pending');
    expect(sale.total_minor).toBe(2 * 150 + 3 * 35);
    expect(await movementsOf(db, sale.id)).toEqual([]); // nothing moves before the money

    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    const deliveries = await allDelivered();
    const events = [...new Set(deliveries.map((d) => d.event_id))];
    // payment_intent.created, charge.succeeded, payment_intent.succeeded, checkout.session.completed
    expect(events).toHaveLength(4);
    for (const e of events) expect(deliveries.filter((d) => d.event_id === e)).toHaveLength(10);

    const paid = await saleRow(db, sale.id);
    expect(paid.status).toBe('paid');
    expect(paid.payment_intent_id).toMatch(/^pi_/);
    const moves = await movementsOf(db, sale.id);
    expect(moves).toHaveLength(2);
    expect(moves.map((m) => [m.part_id, m.qty_delta, m.reason]).sort()).toEqual(
      [
        [t.shop.parts.shrink.id, -2, 'sale'],
        [t.shop.parts.pads.id, -3, 'sale'],
      ].sort(),
    );
    expect(await onShelf(db, t.shop.parts.shrink.id)).toBe(18);
    expect(await onShelf(db, t.shop.parts.pads.id)).toBe(47);
    // Each event recorded once; the sale flipped to paid once.
    const recorded = await db.selectFrom('payment_events').select('id').where('id', 'in', events).execute();
    expect(recorded).toHaveLength(4);
    expect(await paidAudits(sale.id)).toHaveLength(1);

    // Ten more copies of the completion, all at the same moment: still one payment, one move per line.
    const [completed] = (await t.stripe.events.list({ type: 'checkout.session.completed' })).data;
    const body = JSON.stringify(completed);
    const answers = await Promise.all(Array.from({ length: 10 }, () => postEvent(body)));
    expect(answers.map((r) => r.status)).toEqual(Array(10).fill(200));
    expect(await movementsOf(db, sale.id)).toHaveLength(2);
    expect(await onShelf(db, t.shop.parts.shrink.id)).toBe(18);
  });

  it('never undo a payment: an expiry or a decline arriving after it changes nothing', async () => {
    const sale = await startSale([{ partId: t.shop.parts.wire.id, qty: 4 }]);
    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    await allDelivered();
    expect((await saleRow(db, sale.id)).status).toBe('paid');

    const late = [
      sessionEvent('checkout.session.expired', sale),
      {
        ...sessionEvent('payment_intent.payment_failed', sale),
        data: {
          object: {
            id: 'pi_late',
            object: 'payment_intent',
            metadata: { saleId: sale.id, spaceId: sale.space_id },
          },
        },
      },
    ];
    for (const e of late) {
      // A never-seen event, ten copies at once: one is applied (and changes nothing), nine are duplicates.
      const answers = await Promise.all(Array.from({ length: 10 }, () => postEvent(JSON.stringify(e))));
      expect(answers.map((r) => r.status)).toEqual(Array(10).fill(200));
      const outcomes = await Promise.all(
        answers.map(async (r) => ((await r.json()) as { outcome: string }).outcome),
      );
      expect(outcomes.filter((o) => /no change/.test(o))).toHaveLength(1);
      expect(outcomes.filter((o) => /duplicate/.test(o))).toHaveLength(9);
      const rows = await db.selectFrom('payment_events').select('outcome').where('id', '=', e.id).execute();
      expect(rows).toHaveLength(1);
    }
    expect((await saleRow(db, sale.id)).status).toBe('paid');
    expect(await movementsOf(db, sale.id)).toEqual([
      { part_id: t.shop.parts.wire.id, qty_delta: -4, reason: 'sale' },
    ]);
  });

  it('let the money win: a payment that arrives after an expiry still pays the sale, once', async () => {
    const sale = await startSale([{ partId: t.shop.parts.pads.id, qty: 1 }]);
    const expired = await postEvent(JSON.stringify(sessionEvent('checkout.session.expired', sale)));
    expect(expired.status).toBe(200);
    expect((await saleRow(db, sale.id)).status).toBe('expired');
    expect(await movementsOf(db, sale.id)).toEqual([]);

    // The buyer had paid after all: the processor's completion (ten copies, shuffled) arrives late.
    expect((await payOnFake(t.fake, sale.checkout_session_id!)).status).toBe(200);
    await allDelivered();
    expect((await saleRow(db, sale.id)).status).toBe('paid');
    expect(await movementsOf(db, sale.id)).toEqual([
      { part_id: t.shop.parts.pads.id, qty_delta: -1, reason: 'sale' },
    ]);
    const audit = await paidAudits(sale.id);
    expect(audit).toHaveLength(1);
    expect(audit[0].detail).toMatchObject({ was: 'expired' });
  });
});
