import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PaymentsFake } from '@/fakes/payments/server';
import { sweepOverdueSales } from '@/lib/sales/sweep';
import { closeTestDb, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { errorOf, session } from './auth-fixtures';
import {
  closedPort,
  counterSpace,
  movementsOf,
  onShelf,
  ownFake,
  pointSpaceAt,
  saleRow,
  stripeOn,
} from './sales-fixtures';

// The card processor down while someone pays: a clear 503, no sale left pending, nothing off the
// shelf; and no sale stays pending for ever: the sweep settles overdue ones with the processor once
// it answers again, and guesses nothing while it does not.

const db = testDb();
let shop: Awaited<ReturnType<typeof counterSpace>>;
let member: HttpSession;
let port: number;
let fake: PaymentsFake | undefined;
const stateDir = mkdtempSync(path.join(os.tmpdir(), 'ohm-sales-down-'));
const stateFile = path.join(stateDir, 'payments-fake.json');
const basket = () => ({ lines: [{ partId: shop.parts.shrink.id, qty: 3 }] });
const salesOfSpace = () =>
  db
    .selectFrom('sales')
    .select(['id', 'status'])
    .where('space_id', '=', shop.space.id)
    .orderBy('created_at')
    .execute();
const inFortyMinutes = () => new Date(Date.now() + 40 * 60_000);

beforeAll(async () => {
  shop = await counterSpace(db);
  member = await session(shop.people.member);
  port = await closedPort();
  await pointSpaceAt(shop.space.id, port);
});

afterAll(async () => {
  await pointSpaceAt(shop.space.id, null).catch(() => undefined);
  await fake?.close();
  await closeTestDb();
  rmSync(stateDir, { recursive: true, force: true });
});

describe('paying while the processor is down', () => {
  it('answers 503 with a clear message, fails the sale at once and moves no stock', async () => {
    const started = Date.now();
    const res = await member.post('/api/sales', basket());
    expect(res.status).toBe(503);
    const error = await errorOf(res);
    expect(error.code).toBe('unavailable');
    expect(error.message).toMatch(/card processor is not answering/i);
    expect(error.message).toMatch(/nothing was charged/i);
    expect(Date.now() - started).toBeLessThan(15_000);

    expect(await salesOfSpace()).toEqual([{ id: expect.any(String), status: 'failed' }]);
    expect(await onShelf(db, shop.parts.shrink.id)).toBe(20);
    const moved = await db
      .selectFrom('stock_movements')
      .select('id')
      .where('space_id', '=', shop.space.id)
      .where('reason', '=', 'sale')
      .execute();
    expect(moved).toEqual([]);
  });

  it('works again by itself once the processor answers on that port', async () => {
    ({ fake } = await ownFake({ port, stateFile, webhooks: false }));
    const res = await member.post('/api/sales', basket());
    expect(res.status).toBe(201);
    const { sale, url } = (await res.json()) as { sale: { id: string; status: string }; url: string };
    expect(sale.status).toBe('pending');
    expect(url).toContain(`:${port}/pay/`);
  });
});

describe('the sweep: no sale pending for ever', () => {
  it('expires a pending sale past its expiry at the processor and here, without touching stock', async () => {
    const [pending] = (await salesOfSpace()).filter((s) => s.status === 'pending');
    const result = await sweepOverdueSales(db, stripeOn(port), {
      spaceId: shop.space.id,
      now: inFortyMinutes(),
    });
    expect(result).toMatchObject({ checked: 1, expired: 1, paid: 0, unreachable: false });
    const row = await saleRow(db, pending.id);
    expect(row.status).toBe('expired');
    expect((await stripeOn(port).checkout.sessions.retrieve(row.checkout_session_id!)).status).toBe(
      'expired',
    );
    expect(await movementsOf(db, pending.id)).toEqual([]);
    expect(await onShelf(db, shop.parts.shrink.id)).toBe(20);
  });

  it('leaves sales pending while the processor is down, and settles them when it is back', async () => {
    const res = await member.post('/api/sales', basket());
    expect(res.status).toBe(201);
    const saleId = ((await res.json()) as { sale: { id: string } }).sale.id;
    await fake!.close();
    fake = undefined;

    const down = await sweepOverdueSales(db, stripeOn(port), {
      spaceId: shop.space.id,
      now: inFortyMinutes(),
    });
    expect(down).toMatchObject({ unreachable: true, expired: 0, failed: 0 });
    expect((await saleRow(db, saleId)).status).toBe('pending'); // not guessed

    ({ fake } = await ownFake({ port, stateFile, webhooks: false })); // same state, as after a restart
    const back = await sweepOverdueSales(db, stripeOn(port), {
      spaceId: shop.space.id,
      now: inFortyMinutes(),
    });
    expect(back).toMatchObject({ checked: 1, expired: 1, unreachable: false });
    expect((await saleRow(db, saleId)).status).toBe('expired');
    expect(await salesOfSpace()).not.toContainEqual(expect.objectContaining({ status: 'pending' }));
  });

  it('ends a sale at once when the buyer cancels on the pay page', async () => {
    const res = await member.post('/api/sales', basket());
    const saleId = ((await res.json()) as { sale: { id: string } }).sale.id;
    const cancelled = await member.post(`/api/sales/${saleId}/cancel`, {});
    expect(cancelled.status).toBe(200);
    expect(await cancelled.json()).toEqual({ sale: { id: saleId, status: 'expired' } });
    const view = await member.get(`/api/sales/${saleId}`);
    expect(((await view.json()) as { sale: { status: string } }).sale.status).toBe('expired');
  });
});
