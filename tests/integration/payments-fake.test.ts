// The payments fake, driven through the official SDK exactly as the app drives it. No PostgreSQL needed.
// Reference for shapes and rules: the processor's public API reference (errors, pagination,
// idempotent requests, checkout sessions, refunds, balance transactions) and its webhook signature
// documentation ("t=<unix>,v1=<hex HMAC-SHA256 of '<t>.<raw body>'>", 300 s default tolerance).
import { createHmac } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startPaymentsFake, type PaymentsFake } from '@/fakes/payments/server';
import { makeStripe } from '@/lib/payments/stripe';
import { isProcessorUnreachable } from '@/lib/sales/processor-errors';

const KEY = 'sk_test_ohmstead_fake_tests';
const SECRET = 'whsec_ohmstead_fake_tests';
const SUCCESS = '4242 4242 4242 4242';
const DECLINE = '4000 0000 0000 0002';
const FAST_RETRY = { baseMs: 40, maxMs: 200, maxAttempts: 6, timeoutMs: 2_000 };

// ---------- a webhook receiver, as the app's route would see the request ----------
type Received = { body: string; signature: string; eventId: string; type: string };

function startReceiver() {
  const received: Received[] = [];
  let failNext = 0;
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const parsed = JSON.parse(body) as { id: string; type: string };
      received.push({
        body,
        signature: String(req.headers['stripe-signature']),
        eventId: parsed.id,
        type: parsed.type,
      });
      const fail = failNext > 0;
      if (fail) failNext -= 1;
      res.writeHead(fail ? 500 : 200).end(fail ? 'not now' : 'ok');
    });
  });
  return new Promise<{
    url: string;
    received: Received[];
    failNextRequests(n: number): void;
    close(): Promise<void>;
  }>((resolve) =>
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      resolve({
        url: `http://127.0.0.1:${port}/api/payments/webhook`,
        received,
        failNextRequests: (n) => (failNext = n),
        close: () => new Promise((r) => server.close(() => r())),
      });
    }),
  );
}

async function freePort(): Promise<number> {
  const server = http.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

async function waitFor<T>(
  what: string,
  probe: () => T | undefined | false | Promise<T | undefined | false>,
  timeoutMs = 10_000,
): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

const clientFor = (port: number, key = KEY) =>
  makeStripe({
    STRIPE_SECRET_KEY: key,
    PAYMENTS_API_HOST: '127.0.0.1',
    PAYMENTS_API_PORT: port,
    PAYMENTS_API_PROTOCOL: 'http',
  });

// Two consumables of the demo makespace: 2 × 150 + 4 × 35 = 440 minor units (EUR has 2 decimals, ISO 4217).
const BASKET: Stripe.Checkout.SessionCreateParams.LineItem[] = [
  {
    price_data: { currency: 'eur', unit_amount: 150, product_data: { name: 'Heat-shrink tube, 1 m' } },
    quantity: 2,
  },
  {
    price_data: { currency: 'eur', unit_amount: 35, product_data: { name: 'LED, warm white, 5 mm' } },
    quantity: 4,
  },
];
const BASKET_TOTAL = 2 * 150 + 4 * 35;
// The fake's INVENTED demo fee for EUR (no source): 2.5 % rounded half up, plus 25 minor units.
const demoEurFee = (amount: number) => Math.round(amount * 0.025) + 25;

let fake: PaymentsFake;
let receiver: Awaited<ReturnType<typeof startReceiver>>;
let stripe: Stripe;
let stateDir: string;

function newSession(
  extra: Partial<Stripe.Checkout.SessionCreateParams> = {},
  options?: Stripe.RequestOptions,
) {
  return stripe.checkout.sessions.create(
    {
      mode: 'payment',
      line_items: BASKET,
      success_url: 'http://127.0.0.1:3000/counter/paid?session={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://127.0.0.1:3000/counter',
      client_reference_id: 'sale_0001',
      metadata: { sale_id: 'sale_0001', space: 'demo' },
      ...extra,
    },
    options,
  );
}

async function control<T = Record<string, unknown>>(
  route: string,
  body?: unknown,
): Promise<{ status: number; json: T }> {
  const res = await fetch(`${fake.url}/_fake/${route}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, json: (await res.json()) as T };
}

const payForm = (url: string, fields: Record<string, string>) =>
  fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });

/** An expired session gives exactly one event (`checkout.session.expired`) to watch the delivery of. */
async function expiredSessionEvent() {
  await stripe.checkout.sessions.expire((await newSession()).id);
  const [event] = (await stripe.events.list({ type: 'checkout.session.expired' })).data;
  return event;
}

async function paidSession() {
  const session = await newSession();
  const { status } = await control(`sessions/${session.id}/pay`, { card: SUCCESS });
  expect(status).toBe(200);
  return stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] });
}

beforeAll(async () => {
  stateDir = mkdtempSync(path.join(os.tmpdir(), 'payments-fake-'));
  receiver = await startReceiver();
  fake = await startPaymentsFake({
    port: 0,
    webhookUrl: receiver.url,
    webhookSecret: SECRET,
    retry: FAST_RETRY,
  });
  stripe = clientFor(fake.port);
});

afterAll(async () => {
  await fake?.close();
  await receiver?.close();
  rmSync(stateDir, { recursive: true, force: true });
});

beforeEach(async () => {
  await control('reset', {});
  receiver.received.length = 0;
  receiver.failNextRequests(0);
});

describe('checkout sessions through the SDK', () => {
  it('creates a session in the processor’s shape and reads it back with its line items', async () => {
    const created = await newSession();
    expect(created.id).toMatch(/^cs_test_/);
    expect(created).toMatchObject({
      object: 'checkout.session',
      livemode: false,
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      currency: 'eur',
      amount_total: BASKET_TOTAL,
      client_reference_id: 'sale_0001',
      metadata: { sale_id: 'sale_0001', space: 'demo' },
      payment_intent: null,
    });
    expect(created.url).toBe(`${fake.url}/pay/${created.id}`);
    expect(created.expires_at - created.created).toBe(24 * 3600);

    const again = await stripe.checkout.sessions.retrieve(created.id, { expand: ['line_items'] });
    expect(again.id).toBe(created.id);
    expect(again.line_items?.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ['Heat-shrink tube, 1 m', 2, 300],
      ['LED, warm white, 5 mm', 4, 140],
    ]);
    const items = await stripe.checkout.sessions.listLineItems(created.id, { limit: 1 });
    expect(items).toMatchObject({ object: 'list', has_more: true });
    expect(items.data[0].price?.unit_amount).toBe(150);
  });

  it('lists newest first and pages with limit, starting_after and ending_before', async () => {
    const ids: string[] = [];
    for (let i = 0; i < 7; i++) ids.push((await newSession({ client_reference_id: `sale_${i}` })).id);
    const newestFirst = [...ids].reverse();

    const page1 = await stripe.checkout.sessions.list({ limit: 3 });
    expect(page1).toMatchObject({ object: 'list', has_more: true, url: '/v1/checkout/sessions' });
    expect(page1.data.map((s) => s.id)).toEqual(newestFirst.slice(0, 3));
    const page2 = await stripe.checkout.sessions.list({ limit: 3, starting_after: page1.data[2].id });
    expect(page2.data.map((s) => s.id)).toEqual(newestFirst.slice(3, 6));
    const page3 = await stripe.checkout.sessions.list({ limit: 3, starting_after: page2.data[2].id });
    expect(page3.data.map((s) => s.id)).toEqual(newestFirst.slice(6));
    expect(page3.has_more).toBe(false);

    const back = await stripe.checkout.sessions.list({ limit: 3, ending_before: page2.data[0].id });
    expect(back.data.map((s) => s.id)).toEqual(page1.data.map((s) => s.id));
    expect(back.has_more).toBe(false);

    const all = await stripe.checkout.sessions.list({ limit: 2 }).autoPagingToArray({ limit: 100 });
    expect(all.map((s) => s.id)).toEqual(newestFirst);

    const filtered = await stripe.checkout.sessions.list({
      client_reference_id: 'sale_4',
    } as Stripe.Checkout.SessionListParams);
    expect(filtered.data.map((s) => s.id)).toEqual([ids[4]]);
  });

  it('filters lists by created[gte] and created[lt]', async () => {
    const early = [await newSession(), await newSession()];
    const { json } = await control<{ now: number }>('clock', { advance: 3600 });
    const late = [await newSession(), await newSession()];
    const boundary = json.now;

    const newer = await stripe.checkout.sessions.list({ created: { gte: boundary } });
    expect(newer.data.map((s) => s.id)).toEqual(late.map((s) => s.id).reverse());
    const older = await stripe.checkout.sessions.list({ created: { lt: boundary } });
    expect(older.data.map((s) => s.id)).toEqual(early.map((s) => s.id).reverse());
  });

  it('expires an open session with an event, and refuses to expire a paid one', async () => {
    const open = await newSession();
    const expired = await stripe.checkout.sessions.expire(open.id);
    expect(expired).toMatchObject({ status: 'expired', url: null });
    const events = await stripe.events.list({ type: 'checkout.session.expired' });
    expect(events.data.map((e) => (e.data.object as Stripe.Checkout.Session).id)).toEqual([open.id]);
    expect((await fetch(`${fake.url}/pay/${open.id}`)).status).toBe(410);

    const paid = await paidSession();
    await expect(stripe.checkout.sessions.expire(paid.id)).rejects.toMatchObject({
      statusCode: 400,
      type: 'StripeInvalidRequestError',
    });
  });

  it('expires overdue sessions by the fake clock', async () => {
    const now = (await control<{ now: number }>('clock')).json.now;
    const session = await newSession({ expires_at: now + 1800 });
    await control('clock', { advance: 1801 });
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('expired');
    await expect(newSession({ expires_at: now + 60 })).rejects.toMatchObject({
      statusCode: 400,
      param: 'expires_at',
    });
  });
});

describe('errors in the processor’s shape', () => {
  it('requires a test-mode API key (401)', async () => {
    const res = await fetch(`${fake.url}/v1/checkout/sessions`);
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({
      error: { type: 'invalid_request_error', message: expect.stringMatching(/API key/) },
    });
    await expect(
      clientFor(fake.port, 'sk_live_not_for_a_fake').checkout.sessions.list(),
    ).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('answers 404 resource_missing for an unknown id and for an unknown URL', async () => {
    const err = await stripe.checkout.sessions.retrieve('cs_test_nope').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err).toMatchObject({ statusCode: 404, code: 'resource_missing', param: 'id' });
    const res = await fetch(`${fake.url}/v1/customers`, { headers: { Authorization: `Bearer ${KEY}` } });
    expect(res.status).toBe(404);
  });

  it('names the param that is missing, unknown or malformed (400)', async () => {
    await expect(
      stripe.checkout.sessions.create({
        mode: 'payment',
        line_items: BASKET,
      } as Stripe.Checkout.SessionCreateParams),
    ).rejects.toMatchObject({ statusCode: 400, code: 'parameter_missing', param: 'success_url' });
    await expect(newSession({ line_items: [{ price: 'price_123', quantity: 1 }] })).rejects.toMatchObject({
      statusCode: 400,
      code: 'parameter_unknown',
      param: 'line_items[0][price]',
    });

    const res = await fetch(`${fake.url}/v1/checkout/sessions`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${KEY}`, 'Content-Type': 'application/x-www-form-urlencoded' },
      body:
        'mode=payment&success_url=http://x.test/ok&line_items[0][quantity]=two&line_items[0][price_data][currency]=eur' +
        '&line_items[0][price_data][unit_amount]=100&line_items[0][price_data][product_data][name]=Wire',
    });
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({
      error: { type: 'invalid_request_error', param: 'line_items[0][quantity]' },
    });

    await expect(stripe.checkout.sessions.list({ limit: 101 })).rejects.toMatchObject({
      statusCode: 400,
      param: 'limit',
    });
  });
});

describe('idempotent requests', () => {
  it('replays the stored answer for the same key and body, and refuses the key with another body', async () => {
    const first = await newSession({}, { idempotencyKey: 'sale_0001-checkout' });
    const retry = await newSession({}, { idempotencyKey: 'sale_0001-checkout' });
    expect(retry.id).toBe(first.id);
    expect((await stripe.checkout.sessions.list()).data).toHaveLength(1);

    const other = await newSession(
      { metadata: { sale_id: 'sale_0002' } },
      { idempotencyKey: 'sale_0001-checkout' },
    ).catch((e: unknown) => e);
    expect(other).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(other).toMatchObject({ statusCode: 400, rawType: 'idempotency_error' });
  });

  it('marks a replay with Idempotent-Replayed and keys apart per body order-insensitively', async () => {
    const send = (body: string) =>
      fetch(`${fake.url}/v1/refunds`, {
        method: 'POST',
        headers: {
          Authorization: `Bearer ${KEY}`,
          'Idempotency-Key': 'refund-1',
          'Content-Type': 'application/x-www-form-urlencoded',
        },
        body,
      });
    const paid = await paidSession();
    const pi = (paid.payment_intent as Stripe.PaymentIntent).id;
    const a = await send(`payment_intent=${pi}&amount=100`);
    const b = await send(`amount=100&payment_intent=${pi}`);
    expect(a.status).toBe(200);
    expect(b.headers.get('idempotent-replayed')).toBe('true');
    expect(((await b.json()) as { id: string }).id).toBe(((await a.json()) as { id: string }).id);
    expect((await stripe.refunds.list()).data).toHaveLength(1);
  });
});

describe('hosted pay page', () => {
  it('shows the basket, the total and a card form', async () => {
    const session = await newSession();
    const res = await fetch(session.url as string);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('name="card"');
    expect(html).toContain('Heat-shrink tube, 1 m');
    expect(html).toContain('€4.40'); // 440 minor units, EUR exponent 2 (ISO 4217)
  });

  it('keeps the session open on a declined card, then completes it with the success card', async () => {
    const session = await newSession();
    const declined = await payForm(session.url as string, { card: DECLINE, action: 'pay' });
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain('Your card was declined.');
    const afterDecline = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(afterDecline.status).toBe('open');
    expect(afterDecline.payment_intent).toMatchObject({
      status: 'requires_payment_method',
      last_payment_error: { code: 'card_declined', decline_code: 'generic_decline' },
    });
    expect((await stripe.events.list({ type: 'payment_intent.payment_failed' })).data).toHaveLength(1);
    expect((await stripe.balanceTransactions.list()).data).toHaveLength(0);

    const ok = await payForm(session.url as string, { card: SUCCESS, action: 'pay' });
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe(`http://127.0.0.1:3000/counter/paid?session=${session.id}`);

    const done = await stripe.checkout.sessions.retrieve(session.id);
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', url: null });
    const pi = await stripe.paymentIntents.retrieve(done.payment_intent as string, {
      expand: ['latest_charge.balance_transaction'],
    });
    expect(pi).toMatchObject({
      object: 'payment_intent',
      status: 'succeeded',
      amount: BASKET_TOTAL,
      amount_received: BASKET_TOTAL,
    });
    expect(pi.id).toMatch(/^pi_/);
    const charge = pi.latest_charge as Stripe.Charge;
    expect(charge.id).toMatch(/^ch_/);
    expect(charge).toMatchObject({ status: 'succeeded', paid: true, payment_intent: pi.id });
    const txn = charge.balance_transaction as Stripe.BalanceTransaction;
    expect(txn.id).toMatch(/^txn_/);
    expect(txn).toMatchObject({
      type: 'charge',
      amount: BASKET_TOTAL,
      fee: demoEurFee(BASKET_TOTAL),
      net: BASKET_TOTAL - demoEurFee(BASKET_TOTAL),
    });

    const completed = await stripe.events.list({ type: 'checkout.session.completed' });
    expect(completed.data).toHaveLength(1);
    expect(completed.data[0].id).toMatch(/^evt_/);
    expect((completed.data[0].data.object as Stripe.Checkout.Session).payment_status).toBe('paid');
  });

  it('sends Cancel back to cancel_url and leaves the session open', async () => {
    const session = await newSession();
    const res = await payForm(session.url as string, { card: '', action: 'cancel' });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe('http://127.0.0.1:3000/counter');
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
  });

  it('pays through the control endpoint; a declined card answers 402 card_error', async () => {
    const session = await newSession();
    const declined = await control<{ error: { type: string; code: string } }>(`sessions/${session.id}/pay`, {
      card: DECLINE,
    });
    expect(declined.status).toBe(402);
    expect(declined.json.error).toMatchObject({ type: 'card_error', code: 'card_declined' });
    const paid = await control<{ outcome: string; session: { status: string } }>(
      `sessions/${session.id}/pay`,
      { card: SUCCESS },
    );
    expect(paid.status).toBe(200);
    expect(paid.json).toMatchObject({ outcome: 'paid', session: { status: 'complete' } });
    const again = await control(`sessions/${session.id}/pay`, { card: SUCCESS });
    expect(again.status).toBe(400);
  });
});

describe('refunds, balance transactions and payouts', () => {
  it('partial then full refund: each ledger entry is negative, carries no fee, and the charge adds up', async () => {
    const paid = await paidSession();
    const pi = paid.payment_intent as Stripe.PaymentIntent;

    const partial = await stripe.refunds.create({
      payment_intent: pi.id,
      amount: 100,
      reason: 'requested_by_customer',
    });
    expect(partial.id).toMatch(/^re_/);
    expect(partial).toMatchObject({
      object: 'refund',
      amount: 100,
      status: 'succeeded',
      payment_intent: pi.id,
    });
    await expect(
      stripe.refunds.create({ payment_intent: pi.id, amount: BASKET_TOTAL }),
    ).rejects.toMatchObject({
      statusCode: 400,
      code: 'amount_too_large',
      param: 'amount',
    });
    const rest = await stripe.refunds.create({ payment_intent: pi.id });
    expect(rest.amount).toBe(BASKET_TOTAL - 100);
    await expect(stripe.refunds.create({ payment_intent: pi.id })).rejects.toMatchObject({
      code: 'charge_already_refunded',
    });

    const refundTxns = await stripe.balanceTransactions.list({ type: 'refund' });
    expect(refundTxns.data.map((t) => [t.amount, t.fee, t.net, t.source])).toEqual([
      [-(BASKET_TOTAL - 100), 0, -(BASKET_TOTAL - 100), rest.id],
      [-100, 0, -100, partial.id],
    ]);
    const [chargeTxn] = (await stripe.balanceTransactions.list({ type: 'charge' })).data;
    expect(chargeTxn.fee_details).toEqual([
      expect.objectContaining({ amount: demoEurFee(BASKET_TOTAL), type: 'stripe_fee' }),
    ]);

    const charge = await stripe.charges.retrieve((pi.latest_charge as Stripe.Charge).id);
    expect(charge).toMatchObject({ amount_refunded: BASKET_TOTAL, refunded: true });
    expect((await stripe.refunds.retrieve(partial.id)).amount).toBe(100);
    expect((await stripe.refunds.list({ payment_intent: pi.id })).data.map((r) => r.id)).toEqual([
      rest.id,
      partial.id,
    ]);
    expect((await stripe.events.list({ type: 'refund.created' })).data).toHaveLength(2);
    expect((await stripe.events.list({ type: 'charge.refunded' })).data).toHaveLength(2);
  });

  it('a payout sweeps the available balance into a negative payout entry', async () => {
    await paidSession();
    const second = await paidSession();
    await stripe.refunds.create({
      payment_intent: (second.payment_intent as Stripe.PaymentIntent).id,
      amount: 40,
    });
    const expected = 2 * (BASKET_TOTAL - demoEurFee(BASKET_TOTAL)) - 40;
    const balance = await stripe.balance.retrieve();
    expect(balance.available).toEqual([expect.objectContaining({ currency: 'eur', amount: expected })]);

    const { status, json } = await control<{ data: Stripe.Payout[] }>('payouts', {});
    expect(status).toBe(200);
    expect(json.data).toHaveLength(1);
    const payout = await stripe.payouts.retrieve(json.data[0].id, { expand: ['balance_transaction'] });
    expect(payout.id).toMatch(/^po_/);
    expect(payout).toMatchObject({ object: 'payout', amount: expected, currency: 'eur', status: 'paid' });
    expect(payout.balance_transaction).toMatchObject({
      type: 'payout',
      amount: -expected,
      fee: 0,
      net: -expected,
    });
    expect((await stripe.payouts.list()).data.map((p) => p.id)).toEqual([payout.id]);
    expect((await stripe.balance.retrieve()).available[0].amount).toBe(0);
    expect(
      (await stripe.events.list({ type: 'payout.*' } as Stripe.EventListParams)).data
        .map((e) => e.type)
        .sort(),
    ).toEqual(['payout.created', 'payout.paid']);
  });
});

describe('webhooks', () => {
  it('signs every delivery so constructEvent accepts it; a tampered body, a wrong secret or a stale timestamp fail', async () => {
    const session = await paidSession();
    // This session's own delivery (other tests in the file complete sessions too, in no fixed order).
    const delivery = await waitFor('checkout.session.completed delivery', () =>
      receiver.received.find((r) => r.type === 'checkout.session.completed' && r.body.includes(session.id)),
    );
    const event = stripe.webhooks.constructEvent(delivery.body, delivery.signature, SECRET);
    expect(event.type).toBe('checkout.session.completed');
    expect((event.data.object as Stripe.Checkout.Session).id).toBe(session.id);

    // The documented scheme, computed independently of the SDK.
    const [, t, v1] = /^t=(\d+),v1=([0-9a-f]{64})$/.exec(delivery.signature) ?? [];
    expect(v1).toBe(createHmac('sha256', SECRET).update(`${t}.${delivery.body}`).digest('hex'));
    expect(Math.abs(Number(t) - Date.now() / 1000)).toBeLessThan(60);

    const tampered = delivery.body.replace(`"amount_total": ${BASKET_TOTAL}`, '"amount_total": 1');
    expect(tampered).not.toBe(delivery.body);
    expect(() => stripe.webhooks.constructEvent(tampered, delivery.signature, SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() =>
      stripe.webhooks.constructEvent(delivery.body, delivery.signature, 'whsec_someone_else'),
    ).toThrow(Stripe.errors.StripeSignatureVerificationError);
    // Replayed 301 s later the same delivery is outside the default 300 s tolerance; at 299 s it still passes.
    const verifyAfter = (seconds: number) =>
      stripe.webhooks.constructEvent(
        delivery.body,
        delivery.signature,
        SECRET,
        300,
        undefined,
        (Number(t) + seconds) * 1000,
      );
    expect(() => verifyAfter(301)).toThrow(/tolerance/);
    expect(verifyAfter(299).id).toBe(event.id);
  });

  it('retries with backoff until the receiver answers 2xx', async () => {
    receiver.failNextRequests(2);
    const expired = await expiredSessionEvent();
    await waitFor('delivered', () =>
      fake.deliveries().find((d) => d.event_id === expired.id && d.status === 'delivered'),
    );
    const delivery = fake.deliveries().find((d) => d.event_id === expired.id);
    expect(delivery).toMatchObject({ attempts: 3, status: 'delivered', last_status: 200 });
    expect(receiver.received.filter((r) => r.eventId === expired.id)).toHaveLength(3);
  });

  it('gives up after the last attempt, and a flush sends a failed delivery once more', async () => {
    receiver.failNextRequests(FAST_RETRY.maxAttempts);
    const expired = await expiredSessionEvent();
    const failed = await waitFor('failed', () =>
      fake.deliveries().find((d) => d.event_id === expired.id && d.status === 'failed'),
    );
    expect(failed).toMatchObject({ attempts: FAST_RETRY.maxAttempts, last_status: 500 });

    const { json } = await control<{ pending: number }>('deliveries/flush', {});
    expect(json.pending).toBe(1);
    await waitFor('delivered', () =>
      fake.deliveries().find((d) => d.event_id === expired.id && d.status === 'delivered'),
    );
    expect(receiver.received.filter((r) => r.eventId === expired.id)).toHaveLength(
      FAST_RETRY.maxAttempts + 1,
    );
  });

  it('chaos mode delivers every event at least twice and out of order', async () => {
    const chaos = await control('chaos', { duplicate: 3, shuffle: true });
    expect(chaos.json).toEqual({ duplicate: 3, shuffle: true });
    await paidSession();
    const created = (await stripe.events.list({ limit: 100 })).data.reverse().map((e) => e.id);
    expect(created.length).toBeGreaterThanOrEqual(4);
    await waitFor('all copies', () => receiver.received.length >= created.length * 3);

    for (const id of created)
      expect(receiver.received.filter((r) => r.eventId === id).length).toBeGreaterThanOrEqual(2);
    const rank = receiver.received.map((r) => created.indexOf(r.eventId));
    const inCreationOrder = rank.every((r, i) => i === 0 || rank[i - 1] <= r);
    expect(inCreationOrder).toBe(false);
    for (const r of receiver.received)
      expect(stripe.webhooks.constructEvent(r.body, r.signature, SECRET).id).toBe(r.eventId);
  });
});

describe('restart from the state file', () => {
  it('keeps objects and idempotency keys, and resumes deliveries still owed', async () => {
    const stateFile = path.join(stateDir, 'payments.json');
    const deadUrl = `http://127.0.0.1:${await freePort()}/api/payments/webhook`;
    const first = await startPaymentsFake({
      port: 0,
      webhookUrl: deadUrl,
      webhookSecret: SECRET,
      stateFile,
      retry: FAST_RETRY,
    });
    const client1 = clientFor(first.port);
    const session = await client1.checkout.sessions.create(
      { mode: 'payment', line_items: BASKET, success_url: 'http://127.0.0.1:3000/ok' },
      { idempotencyKey: 'restart-1' },
    );
    await client1.checkout.sessions.expire(session.id);
    await waitFor('a failed attempt', () =>
      first.deliveries().find((d) => d.attempts >= 1 && d.status === 'pending'),
    );
    await first.close();

    const receiver2 = await startReceiver();
    const second = await startPaymentsFake({
      port: 0,
      webhookUrl: receiver2.url,
      webhookSecret: SECRET,
      stateFile,
      retry: FAST_RETRY,
    });
    try {
      const client2 = clientFor(second.port);
      expect((await client2.checkout.sessions.retrieve(session.id)).status).toBe('expired');
      const replay = await client2.checkout.sessions.create(
        { mode: 'payment', line_items: BASKET, success_url: 'http://127.0.0.1:3000/ok' },
        { idempotencyKey: 'restart-1' },
      );
      expect(replay.id).toBe(session.id);
      const [expiredEvent] = (await client2.events.list({ type: 'checkout.session.expired' })).data;
      const got = await waitFor('owed delivery', () =>
        receiver2.received.find((r) => r.eventId === expiredEvent.id),
      );
      expect(client2.webhooks.constructEvent(got.body, got.signature, SECRET).type).toBe(
        'checkout.session.expired',
      );
    } finally {
      await second.close();
      await receiver2.close();
    }
  });
});

describe('makeStripe', () => {
  it('names the variable that is missing', () => {
    expect(() =>
      makeStripe({
        STRIPE_SECRET_KEY: '',
        PAYMENTS_API_HOST: '127.0.0.1',
        PAYMENTS_API_PORT: 12111,
        PAYMENTS_API_PROTOCOL: 'http',
      }),
    ).toThrow(/STRIPE_SECRET_KEY/);
    expect(() =>
      makeStripe({
        STRIPE_SECRET_KEY: KEY,
        PAYMENTS_API_HOST: '127.0.0.1',
        PAYMENTS_API_PORT: 'twelve',
        PAYMENTS_API_PROTOCOL: 'http',
      }),
    ).toThrow(/PAYMENTS_API_PORT/);
  });

  it('turns a dead payments service into a connection error within seconds', async () => {
    const dead = clientFor(await freePort());
    const started = Date.now();
    const err = await dead.checkout.sessions.list().catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeConnectionError);
    expect(isProcessorUnreachable(err)).toBe(true);
    expect(isProcessorUnreachable(new Error('other'))).toBe(false);
    expect(Date.now() - started).toBeLessThan(5_000);
  });
});
