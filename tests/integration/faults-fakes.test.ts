import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawn } from 'node:child_process';
import { closeSync, openSync, readFileSync, writeFileSync } from 'node:fs';
import { connect } from 'node:net';
import path from 'node:path';
import PgBoss from 'pg-boss';
import { listMessages, waitForMessage } from '@/lib/mail/mailbox';
import { SWEEP_QUEUE } from '@/lib/reminders/jobs';
import { closeTestDb, makeLocation, makePart, makeStock, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { errorOf, session, staffedSpace } from './auth-fixtures';
import { closedPort, SUCCESS_CARD, waitFor } from './sales-fixtures';

// The local stand-ins for hosted services killed (SIGKILL, no goodbye) and started again, as the
// processes scripts/services.sh runs, with the same state files:
// - the payments fake while it still owes the app a webhook: after its restart it delivers the event,
//   and the sale is paid and its stock moved exactly once;
// - the SMTP sink while a steward sends a reminder: the request says mail is down (503), the reminder
//   stays recorded as pending, and once the sink is back the app's own job runner sends it.

const ROOT = path.resolve(__dirname, '../..');
const RUN = process.env.OHM_TEST_RUN_DIR ?? '';
const FAKE = `http://127.0.0.1:${process.env.PAYMENTS_API_PORT}`;
const APP_WEBHOOK = `${process.env.APP_BASE_URL}/api/payments/webhook`;
const SINK_HEALTH = `http://127.0.0.1:${process.env.SMTP_SINK_HTTP_PORT}/health`;
const WAIT_MS = 45_000; // every wait below is bounded by this

type Service = { name: 'payments-fake' | 'smtp-sink'; script: string; port: number; health: string; env: () => Record<string, string | undefined> };
const PAYMENTS: Service = {
  name: 'payments-fake',
  script: 'fakes/payments/main.ts',
  port: Number(process.env.PAYMENTS_API_PORT),
  health: `${FAKE}/_fake/health`,
  // As scripts/services.sh start_fakes starts it.
  env: () => ({
    PAYMENTS_FAKE_PORT: process.env.PAYMENTS_API_PORT,
    PAYMENTS_FAKE_STATE: path.join(RUN, 'payments-fake.json'),
    PAYMENTS_WEBHOOK_URL: APP_WEBHOOK,
    PAYMENTS_WEBHOOK_SECRET: process.env.STRIPE_WEBHOOK_SECRET,
    PAYMENTS_PUBLIC_URL: FAKE,
  }),
};
const SINK: Service = {
  name: 'smtp-sink',
  script: 'fakes/smtp/main.ts',
  port: Number(process.env.SMTP_PORT),
  health: SINK_HEALTH,
  env: () => ({
    SMTP_SINK_STORE: path.join(RUN, 'mailbox.json'),
    SMTP_SINK_PORT: process.env.SMTP_PORT,
    SMTP_SINK_HTTP_PORT: process.env.SMTP_SINK_HTTP_PORT,
  }),
};

const answers = (url: string) =>
  fetch(url, { signal: AbortSignal.timeout(2_000) }).then(
    (r) => r.ok,
    () => false,
  );

/** True when nothing accepts connections on the port any more. */
const portClosed = (port: number) =>
  new Promise<boolean>((resolve) => {
    const s = connect({ port, host: '127.0.0.1' });
    s.once('connect', () => (s.destroy(), resolve(false)));
    s.once('error', () => resolve(true));
  });

async function kill(svc: Service): Promise<void> {
  const pid = Number(readFileSync(path.join(RUN, `${svc.name}.pid`), 'utf8').trim());
  process.kill(pid, 'SIGKILL');
  await waitFor(`${svc.name} to be gone`, () => portClosed(svc.port), 10_000);
}

/** Starts the service again as its own process; its PID goes where scripts/test.sh's cleanup looks. */
async function start(svc: Service): Promise<void> {
  const log = openSync(path.join(RUN, `${svc.name}.log`), 'a');
  const child = spawn(process.execPath, ['--import', 'tsx', svc.script], {
    cwd: ROOT,
    env: { ...process.env, ...svc.env() },
    detached: true,
    stdio: ['ignore', log, log],
  });
  closeSync(log);
  child.unref();
  writeFileSync(path.join(RUN, `${svc.name}.pid`), `${child.pid}\n`);
  await waitFor(`${svc.name} to answer again`, () => answers(svc.health), 30_000);
}

/** Whatever happened above: the service is up again for the files that run after this one. */
async function ensureUp(svc: Service): Promise<void> {
  if (!(await answers(svc.health))) await start(svc);
}

async function fakeControl<T>(route: string, body?: unknown): Promise<T> {
  const res = await fetch(`${FAKE}/_fake/${route}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`payments fake ${route} answered ${res.status}: ${await res.text()}`);
  return (await res.json()) as T;
}

type Delivery = { id: string; event_id: string; event_type: string | null; status: string; attempts: number };
const deliveries = async () => (await fakeControl<{ data: Delivery[] }>('deliveries')).data;

let space: { id: string };
let member: HttpSession;
let steward: HttpSession;
let memberEmail: string;

beforeAll(async () => {
  if (!RUN || !process.env.PAYMENTS_API_PORT || !process.env.SMTP_PORT)
    throw new Error('OHM_TEST_RUN_DIR and the fakes’ ports are not set: run this file through `npm test` (scripts/test.sh), which starts the fakes it restarts.');
  const staffed = await staffedSpace(testDb(), 'Fakes restart space');
  space = staffed.space;
  memberEmail = staffed.people.member.email;
  member = await session(staffed.people.member);
  steward = await session(staffed.people.steward);
});

afterAll(async () => {
  await ensureUp(PAYMENTS);
  await fakeControl('webhook', { url: APP_WEBHOOK }).catch(() => undefined);
  await ensureUp(SINK);
  await closeTestDb();
}, 90_000);

describe('the payments fake killed while it owes a webhook', () => {
  test('after its restart the owed events arrive: the sale is paid once and its stock moves once', async () => {
    const db = testDb();
    const part = await makePart(db, space.id, { name: 'fault test heat-shrink pack', priceMinor: 250 });
    const bin = await makeLocation(db, space.id);
    await makeStock(db, space.id, part.id, bin.id, 10);
    const known = new Set((await deliveries()).map((d) => d.id));

    // The webhook endpoint unreachable for now, so the events of this payment stay owed.
    await fakeControl('webhook', { url: `http://127.0.0.1:${await closedPort()}/api/payments/webhook` });
    const started = await member.post('/api/sales', { lines: [{ partId: part.id, qty: 2 }] });
    expect(started.status).toBe(201);
    const saleId = ((await started.json()) as { sale: { id: string } }).sale.id;
    const sale = await db.selectFrom('sales').select(['checkout_session_id', 'status']).where('id', '=', saleId).executeTakeFirstOrThrow();
    expect(sale.status).toBe('pending');
    await fakeControl(`sessions/${sale.checkout_session_id}/pay`, { card: SUCCESS_CARD });

    const owed = await waitFor('a failed first attempt at each new delivery', async () => {
      const mine = (await deliveries()).filter((d) => !known.has(d.id));
      return mine.length && mine.every((d) => d.attempts >= 1 && d.status === 'pending') ? mine : undefined;
    }, WAIT_MS);
    const completed = owed.find((d) => d.event_type === 'checkout.session.completed');
    expect(completed).toBeDefined();
    // Nothing reached the app yet: still pending, nothing off the shelf.
    expect((await db.selectFrom('sales').select('status').where('id', '=', saleId).executeTakeFirstOrThrow()).status).toBe('pending');
    expect((await db.selectFrom('stock').select('qty').where('part_id', '=', part.id).executeTakeFirstOrThrow()).qty).toBe(10);

    await kill(PAYMENTS);
    await start(PAYMENTS); // from its state file, webhook URL back to the app's

    // Every owed delivery is accepted by the app, and the app recorded each of those events: the sale
    // was paid by the webhooks that were owed, not by anything else.
    await waitFor('every owed delivery to be accepted', async () => {
      const now = (await deliveries()).filter((d) => owed.some((o) => o.id === d.id));
      return now.length === owed.length && now.every((d) => d.status === 'delivered');
    }, WAIT_MS);
    const recorded = await db.selectFrom('payment_events').select('id').where('id', 'in', owed.map((d) => d.event_id)).execute();
    expect(recorded.map((e) => e.id).sort()).toEqual([...new Set(owed.map((d) => d.event_id))].sort());
    expect((await db.selectFrom('sales').select('status').where('id', '=', saleId).executeTakeFirstOrThrow()).status).toBe('paid');
    const moves = await db.selectFrom('stock_movements').select(['qty_delta', 'reason']).where('ref_id', '=', saleId).execute();
    expect(moves).toEqual([{ qty_delta: -2, reason: 'sale' }]);
    const left = await db.selectFrom('stock').select('qty').where('part_id', '=', part.id).executeTakeFirstOrThrow();
    expect(left.qty).toBe(8);
  }, 120_000);
});

describe('the SMTP sink killed while a reminder is sent', () => {
  test('the request answers 503, the reminder stays pending, and the job runner sends it once mail is back', async () => {
    const db = testDb();
    const tool = await makePart(db, space.id, { name: 'fault test wire stripper', category: 'tool' });
    const bin = await makeLocation(db, space.id);
    await makeStock(db, space.id, tool.id, bin.id, 3);
    const borrowed = await member.post('/api/loans', { counted: [{ partId: tool.id, locationId: bin.id, qty: 1 }] });
    expect(borrowed.status).toBe(201);
    const loanId = ((await borrowed.json()) as { loan: { id: string } }).loan.id;

    await kill(SINK);
    const res = await steward.post('/api/reminders', { loanIds: [loanId] });
    expect(res.status).toBe(503);
    expect((await errorOf(res)).code).toBe('unavailable');
    const recorded = await db.selectFrom('reminders').select(['id', 'status', 'kind']).where('loan_id', '=', loanId).execute();
    expect(recorded).toEqual([{ id: expect.any(String), status: 'pending', kind: 'manual' }]);

    await start(SINK);
    // The sweep runs every ten minutes; rather than wait for the slot, queue a run the way the schedule
    // does. The app's own worker picks it up and sends what is pending.
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, supervise: false, schedule: false, migrate: false, max: 1 });
    boss.on('error', () => undefined);
    await boss.start();
    try {
      await boss.send(SWEEP_QUEUE, {});
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }

    await waitFor('the reminder to be sent', async () => {
      const r = await db.selectFrom('reminders').select('status').where('id', '=', recorded[0].id).executeTakeFirstOrThrow();
      return r.status === 'sent';
    }, WAIT_MS);
    const mail = await waitForMessage({ to: memberEmail, match: (m) => m.text.includes(`/loans/${loanId}`), timeoutMs: 10_000 });
    expect(mail.subject).toContain('fault test wire stripper');
    // Sent once: one reminder row, one message for this loan.
    expect(await db.selectFrom('reminders').select('status').where('loan_id', '=', loanId).execute()).toEqual([{ status: 'sent' }]);
    const forLoan = (await listMessages({ to: memberEmail })).filter((m) => m.text.includes(`/loans/${loanId}`));
    expect(forLoan.map((m) => m.id)).toEqual([mail.id]);
  }, 120_000);
});
