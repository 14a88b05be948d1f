import { createServer } from 'node:net';
import Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { startPaymentsFake, type PaymentsFake } from '@/fakes/payments/server';
import { makeStripe } from '@/lib/payments/stripe';
import { afterAll, beforeAll } from 'vitest';
import { closeTestDb, makeLocation, makePart, makeStock, makeUser, testDb } from '../helpers/db';
import { BASE, type HttpSession } from '../helpers/http';
import { session, staffedSpace } from './auth-fixtures';

// Shared set-up for the sales-*, webhook-* and reconcile-* files (not a test file itself).

/** The secret the app under test verifies webhooks with (scripts/test.sh sets it for both sides). */
export const WEBHOOK_SECRET = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_ohmstead_local_dev_secret';
export const SUCCESS_CARD = '4242 4242 4242 4242';
export const DECLINE_CARD = '4000 0000 0000 0002';
const KEY = process.env.STRIPE_SECRET_KEY ?? 'sk_test_ohmstead_tests';

/** A space with one person per role, a bin, and three priced consumables with stock. */
export async function counterSpace(db: Db) {
  const { space, people } = await staffedSpace(db, 'Counter test space');
  const bin = await makeLocation(db, space.id);
  const shrink = await makePart(db, space.id, { name: 'Heat-shrink sleeve pack', priceMinor: 150 });
  const pads = await makePart(db, space.id, { name: 'Thermal pad for star board', priceMinor: 35 });
  const wire = await makePart(db, space.id, {
    name: 'Twin lead, per metre',
    category: 'wire',
    priceMinor: 60,
  });
  await makeStock(db, space.id, shrink.id, bin.id, 20);
  await makeStock(db, space.id, pads.id, bin.id, 50);
  await makeStock(db, space.id, wire.id, bin.id, 40);
  const buyer2 = await makeUser(db, space.id, ['member'], 'Second member');
  return { space, people: { ...people, buyer2 }, bin, parts: { shrink, pads, wire } };
}

/** This test's own payments fake, delivering webhooks to the app under test. */
export async function ownFake(
  options: {
    port?: number;
    chaos?: { duplicate?: number; shuffle?: boolean };
    stateFile?: string;
    webhooks?: boolean;
  } = {},
) {
  const fake = await startPaymentsFake({
    port: options.port ?? 0,
    webhookUrl: options.webhooks === false ? null : `${BASE}/api/payments/webhook`,
    webhookSecret: WEBHOOK_SECRET,
    chaos: options.chaos,
    stateFile: options.stateFile,
    retry: { baseMs: 100, maxMs: 1_000, maxAttempts: 8, timeoutMs: 10_000 },
  });
  return { fake, stripe: stripeOn(fake.port) };
}

export const stripeOn = (port: number): Stripe =>
  makeStripe({
    STRIPE_SECRET_KEY: KEY,
    PAYMENTS_API_HOST: '127.0.0.1',
    PAYMENTS_API_PORT: port,
    PAYMENTS_API_PROTOCOL: 'http',
    PAYMENTS_API_TIMEOUT_MS: 3_000,
  });

/** Points one space's processor calls in the app at a port (test hook; null puts it back). */
export async function pointSpaceAt(spaceId: string, port: number | null): Promise<void> {
  const res = await fetch(`${BASE}/api/payments/test-endpoint`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ spaceId, port }),
  });
  if (!res.ok)
    throw new Error(`payments test hook answered ${res.status}: is the app running with OHM_TEST_HOOKS=1?`);
}

/** A port nothing listens on: bind one, note it, let it go. */
export async function closedPort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const port = (probe.address() as { port: number }).port;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return port;
}

export async function payOnFake(
  fake: PaymentsFake,
  sessionId: string,
  card = SUCCESS_CARD,
): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await fetch(`${fake.url}/_fake/sessions/${encodeURIComponent(sessionId)}/pay`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ card }),
  });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}

/** Signs a body the documented way (SDK helper) and POSTs it to the app's webhook route. */
export async function postEvent(
  body: string,
  opts: { secret?: string; timestamp?: number; header?: string | null } = {},
): Promise<Response> {
  const header =
    opts.header === undefined
      ? Stripe.webhooks.generateTestHeaderString({
          payload: body,
          secret: opts.secret ?? WEBHOOK_SECRET,
          timestamp: opts.timestamp,
        })
      : opts.header;
  return fetch(`${BASE}/api/payments/webhook`, {
    method: 'POST',
    headers: {
      'content-type': 'application/json',
      ...(header === null ? {} : { 'stripe-signature': header }),
    },
    body,
  });
}

/** An event in the processor's shape about a sale's checkout session (for out-of-order and forged deliveries). */
export function sessionEvent(
  type: string,
  sale: {
    id: string;
    space_id: string;
    checkout_session_id: string | null;
    total_minor: number;
    currency: string;
  },
  over: Record<string, unknown> = {},
) {
  const paid = type === 'checkout.session.completed';
  return {
    id: `evt_test_${type.replace(/\W/g, '_')}_${Math.random().toString(36).slice(2, 12)}`,
    object: 'event',
    api_version: null,
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type,
    data: {
      object: {
        id: sale.checkout_session_id,
        object: 'checkout.session',
        amount_total: sale.total_minor,
        currency: sale.currency.toLowerCase(),
        client_reference_id: sale.id,
        metadata: { saleId: sale.id, spaceId: sale.space_id },
        mode: 'payment',
        payment_intent: paid ? `pi_test_${Math.random().toString(36).slice(2, 12)}` : null,
        payment_status: paid ? 'paid' : 'unpaid',
        status: paid ? 'complete' : 'expired',
        ...over,
      },
    },
  };
}

export async function waitFor<T>(
  what: string,
  probe: () => Promise<T | undefined | null | false> | T | undefined | null | false,
  ms = 30_000,
): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export const saleRow = (db: Db, id: string) =>
  db.selectFrom('sales').selectAll().where('id', '=', id).executeTakeFirstOrThrow();

export const movementsOf = (db: Db, saleId: string) =>
  db
    .selectFrom('stock_movements')
    .select(['part_id', 'qty_delta', 'reason'])
    .where('ref_type', '=', 'sale')
    .where('ref_id', '=', saleId)
    .orderBy('part_id')
    .execute();

export async function onShelf(db: Db, partId: string): Promise<number> {
  const rows = await db.selectFrom('stock').select('qty').where('part_id', '=', partId).execute();
  return rows.reduce((s, r) => s + r.qty, 0);
}

export type CounterShop = {
  shop: Awaited<ReturnType<typeof counterSpace>>;
  fake: PaymentsFake;
  stripe: Stripe;
  member: HttpSession;
  steward: HttpSession;
  treasurer: HttpSession;
};

/**
 * The set-up the counter's test files share, as vitest hooks: a space of their own with priced stock,
 * a payments fake of their own that the app is pointed at for that space, and signed-in sessions.
 * The fields fill in when the file's tests start.
 */
export function setUpCounterShop(fakeOptions: Parameters<typeof ownFake>[0] = {}): CounterShop {
  const t = {} as CounterShop;
  beforeAll(async () => {
    const db = testDb();
    t.shop = await counterSpace(db);
    Object.assign(t, await ownFake(fakeOptions));
    await pointSpaceAt(t.shop.space.id, t.fake.port);
    t.member = await session(t.shop.people.member);
    t.steward = await session(t.shop.people.steward);
    t.treasurer = await session(t.shop.people.treasurer);
  });
  afterAll(async () => {
    if (t.shop) await pointSpaceAt(t.shop.space.id, null).catch(() => undefined);
    await t.fake?.close();
    await closeTestDb();
  });
  return t;
}
