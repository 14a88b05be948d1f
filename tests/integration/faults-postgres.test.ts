import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawn } from 'node:child_process';
import path from 'node:path';
import { closeTestDb, makeLocation, makePart, makeStock, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { session, staffedSpace } from './auth-fixtures';

// PostgreSQL restarted in the middle of a burst of real requests against the running production build.
// Writes that commit (stock received into a bin, loans of counted stock, cash sales) and reads run ten at a time
// while the test run's own cluster is restarted (pg_ctl -m fast: every open session is cut). The app must
// answer 2xx or 503 (never a 500, never hang), recover without being restarted, and every write that
// answered 2xx must be in the database afterwards, whole (its stock movement and audit row with it).

const ROOT = path.resolve(__dirname, '../..');
const CONCURRENCY = 10;
const BEFORE_RESTART = 40; // requests answered before the restart begins
const AFTER_RECOVERY = 80; // requests started after the restart, all of which must succeed
const MAX_REQUESTS = 1_000; // hard bounds on the burst, whatever happens
const MAX_BURST_MS = 60_000;
const REQUEST_TIMEOUT_MS = 10_000; // the database's connect timeout is 3 s: an answer takes far less
const SETTLE_MS = 1_000; // after pg_ctl reports the server up, before "must succeed" applies
const BORROWERS = 8; // × 100 open loans each: more than the burst can lend (MAX_REQUESTS / 5)

type Kind = 'receive' | 'borrow' | 'sell' | 'list' | 'scan';
type Outcome = { i: number; kind: Kind; status: number; startedAt: number; ms: number; note?: string; id?: string; code?: string };

let steward: HttpSession;
let fixture: {
  spaceId: string;
  partId: string;
  partCode: string;
  receiveBin: string;
  loanBin: string;
  toolId: string;
  borrowers: string[];
  sellableId: string;
  saleBin: string;
};
const START_QTY = 100_000;

/** Restarts the test run's cluster with its own options (scripts/lib.sh pg_restart); resolves when it is up. */
function restartPostgres(): Promise<{ ms: number }> {
  const data = process.env.OHM_TEST_PG_DATA!;
  const started = Date.now();
  return new Promise((resolve, reject) => {
    // Wait for 'exit', not for the pipes: the new postmaster must not be able to keep the test waiting.
    const child = spawn('bash', ['-c', 'source scripts/lib.sh && pg_restart "$1"', 'pg_restart', data], {
      cwd: ROOT,
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    const timer = setTimeout(() => child.kill('SIGKILL'), 90_000);
    child.on('exit', (code) => {
      clearTimeout(timer);
      if (code === 0) resolve({ ms: Date.now() - started });
      else reject(new Error(`pg_restart exited ${code}: ${err}`));
    });
  });
}

async function one(i: number, kind: Kind): Promise<Outcome> {
  const startedAt = Date.now();
  const signal = AbortSignal.timeout(REQUEST_TIMEOUT_MS);
  const out: Outcome = { i, kind, status: 0, startedAt, ms: 0 };
  try {
    let res: Response;
    if (kind === 'receive') {
      out.note = `restart burst ${i}`;
      res = await steward.fetch('/api/stock/receive', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ partId: fixture.partId, locationId: fixture.receiveBin, qty: 1, note: out.note }),
        signal,
      });
    } else if (kind === 'borrow') {
      res = await steward.fetch('/api/loans', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({
          counted: [{ partId: fixture.toolId, locationId: fixture.loanBin, qty: 1 }],
          borrowerId: fixture.borrowers[Math.abs(i) % fixture.borrowers.length],
        }),
        signal,
      });
    } else if (kind === 'sell') {
      res = await steward.fetch('/api/sales/cash', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ lines: [{ partId: fixture.sellableId, qty: 1 }] }),
        signal,
      });
    } else if (kind === 'list') {
      res = await steward.fetch('/api/parts?q=restart&sort=name&pageSize=20', { signal });
    } else {
      res = await steward.fetch(`/api/scan/${fixture.partCode}`, { signal });
    }
    out.status = res.status;
    const body = (await res.json().catch(() => null)) as { loan?: { id: string }; sale?: { id: string }; error?: { code: string } } | null;
    if (res.status === 201) out.id = body?.loan?.id ?? body?.sale?.id;
    if (res.status >= 400) out.code = body?.error?.code;
  } catch (err) {
    // 0 = no answer at all (connection refused or reset, or no answer within the timeout).
    out.code = err instanceof Error ? err.name : 'error';
  }
  out.ms = Date.now() - startedAt;
  return out;
}

const KINDS: Kind[] = ['receive', 'borrow', 'sell', 'list', 'scan'];

/**
 * The burst: CONCURRENCY workers each send one request after another. After BEFORE_RESTART answers the
 * cluster is restarted; the workers keep going until AFTER_RECOVERY requests have started after it came
 * back (plus SETTLE_MS), bounded by MAX_REQUESTS and MAX_BURST_MS.
 */
async function burst() {
  const outcomes: Outcome[] = [];
  // Set from inside the workers; an object so the type checker does not narrow them to their start.
  const restart: { running: Promise<{ ms: number }> | null; upAt: number; error: unknown } = { running: null, upAt: Infinity, error: null };
  let issued = 0;
  const began = Date.now();
  const startedAfterRecovery = () => outcomes.filter((o) => o.startedAt >= restart.upAt + SETTLE_MS).length;
  const done = () =>
    issued >= MAX_REQUESTS ||
    Date.now() - began > MAX_BURST_MS ||
    restart.error !== null ||
    (restart.running !== null && startedAfterRecovery() >= AFTER_RECOVERY);

  const worker = async () => {
    while (!done()) {
      const i = issued++;
      outcomes.push(await one(i, KINDS[i % KINDS.length]));
      if (!restart.running && outcomes.length >= BEFORE_RESTART) {
        restart.running = restartPostgres();
        restart.running.then(
          () => (restart.upAt = Date.now()),
          (err: unknown) => (restart.error = err),
        );
      }
    }
  };
  await Promise.all(Array.from({ length: CONCURRENCY }, worker));
  if (restart.error) throw restart.error;
  if (!restart.running) throw new Error(`the burst ended after ${outcomes.length} requests, before the restart began`);
  const { ms } = await restart.running;
  return { outcomes, restartMs: ms, upAt: restart.upAt, burstMs: Date.now() - began };
}

beforeAll(async () => {
  if (!process.env.OHM_TEST_PG_DATA || !process.env.OHM_TEST_PG_PORT)
    throw new Error('OHM_TEST_PG_DATA / OHM_TEST_PG_PORT are not set: run this file through `npm test` (scripts/test.sh), which owns the cluster it restarts.');
  const db = testDb();
  const { space, people } = await staffedSpace(db, 'Restart burst space');
  // Loans here are many and quick, lent by the steward to several members in turn, so the open-loan
  // limit (at most 100 each) is never what answers.
  await db.updateTable('spaces').set({ max_open_loans: 100 }).where('id', '=', space.id).execute();
  const borrowers = [people.member.id];
  for (let i = 1; i < BORROWERS; i++) borrowers.push((await makeUser(db, space.id, ['member'], `Borrower ${i}`)).id);
  const part = await makePart(db, space.id, { name: 'restart burst solder wick', category: 'consumable' });
  const tool = await makePart(db, space.id, { name: 'restart burst crimp tool', category: 'tool' });
  const forSale = await makePart(db, space.id, { name: 'restart burst cable ties', category: 'consumable', priceMinor: 120 });
  const receiveBin = await makeLocation(db, space.id);
  const loanBin = await makeLocation(db, space.id);
  const saleBin = await makeLocation(db, space.id);
  await makeStock(db, space.id, part.id, receiveBin.id, START_QTY);
  await makeStock(db, space.id, tool.id, loanBin.id, START_QTY);
  await makeStock(db, space.id, forSale.id, saleBin.id, START_QTY);
  fixture = {
    spaceId: space.id,
    partId: part.id,
    partCode: part.code!,
    receiveBin: receiveBin.id,
    loanBin: loanBin.id,
    toolId: tool.id,
    borrowers,
    sellableId: forSale.id,
    saleBin: saleBin.id,
  };
  steward = await session(people.steward);
});

afterAll(async () => {
  await closeTestDb();
});

describe('PostgreSQL restarted in the middle of a burst', () => {
  let result: Awaited<ReturnType<typeof burst>>;

  test('before the burst, every kind of request succeeds (so failures below are the restart’s)', async () => {
    for (const [i, kind] of KINDS.entries()) {
      const o = await one(-1 - i, kind);
      expect(o.status, `${kind}: ${o.code}`).toBeGreaterThanOrEqual(200);
      expect(o.status, `${kind}: ${o.code}`).toBeLessThan(300);
    }
  });

  test('every answer is 2xx or 503, none hangs, and the down time shows as 503', async () => {
    result = await burst();
    const { outcomes } = result;
    const unavailable = outcomes.filter((o) => o.status === 503);
    console.log(
      `[faults] ${outcomes.length} requests in ${result.burstMs} ms; restart took ${result.restartMs} ms; ` +
        `${outcomes.filter((o) => o.status >= 200 && o.status < 300).length} × 2xx, ${unavailable.length} × 503`,
    );
    const bad = outcomes.filter((o) => !(o.status >= 200 && o.status < 300) && o.status !== 503);
    expect(bad.map((o) => `#${o.i} ${o.kind}: ${o.status} ${o.code ?? ''} after ${o.ms} ms`)).toEqual([]);
    expect(outcomes.every((o) => o.ms < REQUEST_TIMEOUT_MS)).toBe(true);
    // The window was really hit: some requests saw the database gone, and said so with 503 unavailable.
    expect(unavailable.length).toBeGreaterThan(0);
    expect(unavailable.every((o) => o.code === 'unavailable')).toBe(true);
  }, MAX_BURST_MS + 90_000);

  test('the app recovers by itself: every request started after the server came back succeeds', () => {
    const after = result.outcomes.filter((o) => o.startedAt >= result.upAt + SETTLE_MS);
    expect(after.length).toBeGreaterThanOrEqual(AFTER_RECOVERY);
    expect(after.filter((o) => o.status < 200 || o.status >= 300).map((o) => `#${o.i} ${o.kind}: ${o.status}`)).toEqual([]);
    // Every kind of request, reads and writes, came back.
    for (const kind of KINDS) expect(after.some((o) => o.kind === kind)).toBe(true);
  });

  test('no committed write is lost, and none is half there', async () => {
    const db = testDb();
    const ok = (k: Kind) => result.outcomes.filter((o) => o.kind === k && o.status >= 200 && o.status < 300);
    const receivedNotes = ok('receive').map((o) => o.note!);
    const loanIds = ok('borrow').map((o) => o.id!);
    const saleIds = ok('sell').map((o) => o.id!);
    expect(receivedNotes.length).toBeGreaterThan(0);
    expect(loanIds.length).toBeGreaterThan(0);
    expect(saleIds.length).toBeGreaterThan(0);

    const moves = await db
      .selectFrom('stock_movements')
      .select(['note', 'qty_delta', 'reason', 'ref_id', 'location_id'])
      .where('space_id', '=', fixture.spaceId)
      .execute();
    const notes = new Set(moves.filter((m) => m.reason === 'receive').map((m) => m.note));
    expect(receivedNotes.filter((n) => !notes.has(n))).toEqual([]);
    const loans = await db.selectFrom('loans').select('id').where('space_id', '=', fixture.spaceId).execute();
    const have = new Set(loans.map((l) => l.id));
    expect(loanIds.filter((id) => !have.has(id))).toEqual([]);
    const sales = await db.selectFrom('sales').select(['id', 'status']).where('space_id', '=', fixture.spaceId).execute();
    const sold = new Set(sales.map((x) => x.id));
    expect(saleIds.filter((id) => !sold.has(id))).toEqual([]);
    expect(sales.every((x) => x.status === 'paid')).toBe(true);

    // Whole transactions only: each bin's quantity is its start plus its movements, each loan has its
    // line and its stock movement, each receipt its audit row.
    const qty = async (bin: string) =>
      (await db.selectFrom('stock').select('qty').where('location_id', '=', bin).executeTakeFirstOrThrow()).qty;
    const sumIn = (bin: string) => moves.filter((m) => m.location_id === bin).reduce((s, m) => s + m.qty_delta, 0);
    expect(await qty(fixture.receiveBin)).toBe(START_QTY + sumIn(fixture.receiveBin));
    expect(await qty(fixture.loanBin)).toBe(START_QTY + sumIn(fixture.loanBin));
    expect(await qty(fixture.saleBin)).toBe(START_QTY + sumIn(fixture.saleBin));
    expect(moves.filter((m) => m.reason === 'sale').length).toBe(sales.length);
    const lines = await db.selectFrom('loan_lines').select('loan_id').where('space_id', '=', fixture.spaceId).execute();
    expect(lines.length).toBe(loans.length);
    expect(moves.filter((m) => m.reason === 'loan_out').length).toBe(loans.length);
    const audits = await db
      .selectFrom('audit_log')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', fixture.spaceId)
      .where('action', '=', 'stock.received')
      .executeTakeFirstOrThrow();
    expect(audits.n).toBe(moves.filter((m) => m.reason === 'receive').length);
  });
});
