import { beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../helpers/db';
import { errorOf } from './auth-fixtures';
import {
  WEBHOOK_SECRET,
  movementsOf,
  postEvent,
  saleRow,
  sessionEvent,
  setUpCounterShop,
} from './sales-fixtures';

// The webhook route trusts nothing it cannot verify: the processor's documented scheme signs
// "<timestamp>.<raw body>" with HMAC-SHA256 under the endpoint's secret and rejects timestamps older
// than five minutes (the SDK's default tolerance). A forged, tampered or replayed-late delivery gets
// a 400 naming the header, and nothing of it is applied. This file's fake sends no webhooks of its own.

const db = testDb();
const t = setUpCounterShop({ webhooks: false });

let sale: Awaited<ReturnType<typeof saleRow>>;

beforeAll(async () => {
  const res = await t.member.post('/api/sales', { lines: [{ partId: t.shop.parts.shrink.id, qty: 1 }] });
  expect(res.status).toBe(201);
  sale = await saleRow(db, ((await res.json()) as { sale: { id: string } }).sale.id);
});

async function expectNothingApplied(eventId: string) {
  expect(await db.selectFrom('payment_events').select('id').where('id', '=', eventId).execute()).toEqual([]);
  expect((await saleRow(db, sale.id)).status).toBe('pending');
  expect(await movementsOf(db, sale.id)).toEqual([]);
}

describe('webhook signatures', () => {
  it('refuses a delivery without a signature header', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const res = await postEvent(JSON.stringify(event), { header: null });
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields).toHaveProperty('stripe-signature');
    await expectNothingApplied(event.id);
  });

  it('refuses a signature made with another secret', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const res = await postEvent(JSON.stringify(event), { secret: `${WEBHOOK_SECRET}_not` });
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields?.['stripe-signature']?.[0]).toMatch(/signature/i);
    await expectNothingApplied(event.id);
  });

  it('refuses a body changed after signing', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const signed = JSON.stringify(event);
    const good = (await import('stripe')).default.webhooks.generateTestHeaderString({
      payload: signed,
      secret: WEBHOOK_SECRET,
    });
    const tampered = signed.replace(`"amount_total":${sale.total_minor}`, '"amount_total":1');
    expect(tampered).not.toBe(signed);
    const res = await postEvent(tampered, { header: good });
    expect(res.status).toBe(400);
    await expectNothingApplied(event.id);
  });

  it('refuses a correctly signed delivery older than the five-minute tolerance', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const res = await postEvent(JSON.stringify(event), { timestamp: Math.floor(Date.now() / 1000) - 6 * 60 });
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields?.['stripe-signature']?.[0]).toMatch(/tolerance|timestamp/i);
    await expectNothingApplied(event.id);
  });

  it('refuses a malformed header', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const res = await postEvent(JSON.stringify(event), { header: 't=yesterday,v1=zz' });
    expect(res.status).toBe(400);
    await expectNothingApplied(event.id);
  });

  it('applies the same event once it is signed properly', async () => {
    const event = sessionEvent('checkout.session.completed', sale);
    const res = await postEvent(JSON.stringify(event));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ received: true, id: event.id, outcome: 'sale paid' });
    expect((await saleRow(db, sale.id)).status).toBe('paid');
    expect(await movementsOf(db, sale.id)).toEqual([
      { part_id: t.shop.parts.shrink.id, qty_delta: -1, reason: 'sale' },
    ]);
  });

  it('records an event it does not act on, once, and answers 200 so the processor stops sending it', async () => {
    const event = {
      ...sessionEvent('customer.created', sale),
      data: { object: { id: 'cus_x', object: 'customer' } },
    };
    const first = await postEvent(JSON.stringify(event));
    expect(first.status).toBe(200);
    expect((await first.json()) as { outcome: string }).toMatchObject({
      outcome: expect.stringMatching(/ignored/),
    });
    const again = await postEvent(JSON.stringify(event));
    expect((await again.json()) as { outcome: string }).toMatchObject({
      outcome: expect.stringMatching(/duplicate/),
    });
    expect(
      await db.selectFrom('payment_events').select('id').where('id', '=', event.id).execute(),
    ).toHaveLength(1);
  });
});
