import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeLocation, testDb } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeStock, makeUnit, type ErrorBody } from './loans-fixtures';

// Borrowing through real HTTP against the production build and real PostgreSQL: the last unit under
// 100 concurrent borrows, the server-side gate (fail / caution / override), the open-loan limit, the
// due date at closing time in the space's zone, and tenancy.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let steward: HttpSession;
let racers: HttpSession[];
// Members 10 and up take part in one test each, so the race winners' loans never touch their limits.
let members: HttpSession[];

const chicagoWall = (iso: string) =>
  new Intl.DateTimeFormat('en-GB', {
    timeZone: 'America/Chicago',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(new Date(iso));

beforeAll(async () => {
  fx = await loanSpace(db, { members: 16 });
  await db
    .updateTable('spaces')
    .set({ closing_time: '19:30', max_open_loans: 3 })
    .where('id', '=', fx.space.id)
    .execute();
  parts = await chainParts(db, fx.space.id);
  steward = await login(fx.steward);
  const all = await Promise.all(fx.members.map(login));
  racers = all.slice(0, 10);
  members = all.slice(10);
});
afterAll(closeTestDb);

/** A fresh supply + driver + LEDs, each free on the shelf. */
async function looseChain(supplyPartId: string, ledPartId: string, leds: number) {
  const supply = await makeUnit(db, fx.space.id, supplyPartId, fx.bin.id);
  const driver = await makeUnit(db, fx.space.id, parts.driver.id, fx.bin.id);
  const ledBin = await makeLocation(db, fx.space.id);
  await makeStock(db, fx.space.id, ledPartId, ledBin.id, leds + 5);
  return {
    supply,
    driver,
    ledBin,
    body: {
      unitIds: [supply.id, driver.id],
      counted: [{ partId: ledPartId, locationId: ledBin.id, qty: leds }],
    },
  };
}

async function stateOf(unitId: string) {
  return (await db.selectFrom('units').select('state').where('id', '=', unitId).executeTakeFirstOrThrow())
    .state;
}
async function qtyOf(partId: string, locationId: string) {
  return (
    await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', partId)
      .where('location_id', '=', locationId)
      .executeTakeFirstOrThrow()
  ).qty;
}

describe('the last unit', () => {
  test('100 concurrent borrows of the same last unit: exactly one 201, the rest 409', async () => {
    const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const results = await Promise.all(
      Array.from({ length: 100 }, (_, i) =>
        racers[i % racers.length].post('/api/loans', { unitIds: [meter.id] }),
      ),
    );
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(99);
    expect(await stateOf(meter.id)).toBe('out');
    const lines = await db
      .selectFrom('loan_lines')
      .select('loan_id')
      .where('unit_id', '=', meter.id)
      .execute();
    expect(lines).toHaveLength(1);
    const moves = await db
      .selectFrom('stock_movements')
      .select('reason')
      .where('unit_id', '=', meter.id)
      .where('reason', '=', 'loan_out')
      .execute();
    expect(moves).toHaveLength(1);
  });

  test('100 concurrent borrows of the last counted part: one 201, the bin never below 0', async () => {
    const bin = await makeLocation(db, fx.space.id);
    await makeStock(db, fx.space.id, parts.led.id, bin.id, 1);
    const results = await Promise.all(
      Array.from({ length: 100 }, (_, i) =>
        racers[i % racers.length].post('/api/loans', {
          counted: [{ partId: parts.led.id, locationId: bin.id, qty: 1 }],
        }),
      ),
    );
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.every((s) => s === 201 || s === 409)).toBe(true);
    expect(await qtyOf(parts.led.id, bin.id)).toBe(0);
    const moves = await db
      .selectFrom('stock_movements')
      .select('qty_delta')
      .where('location_id', '=', bin.id)
      .where('reason', '=', 'loan_out')
      .execute();
    expect(moves.map((m) => m.qty_delta)).toEqual([-1]);
  });
});

describe('the gate runs on the server', () => {
  test('a failing chain cannot be borrowed even when the client skips the page', async () => {
    // Six LEDs need about 19 V (6 × 3.2 V); a 12 V supply through a step-down driver cannot give it.
    const chain = await looseChain(parts.supply12.id, parts.led.id, 6);
    const before = await qtyOf(parts.led.id, chain.ledBin.id);
    const res = await members[0].post('/api/loans', { ...chain.body, acknowledgeCaution: true });
    expect(res.status).toBe(409);
    expect((await json<ErrorBody>(res)).error.fields).toHaveProperty('override');
    expect(await stateOf(chain.supply.id)).toBe('on_shelf');
    expect(await stateOf(chain.driver.id)).toBe('on_shelf');
    expect(await qtyOf(parts.led.id, chain.ledBin.id)).toBe(before);

    // The preview says why, and names a free supply that would work with these LEDs.
    const free24 = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    const pv = await json<{
      preview: {
        outcome: { verdict: string; changes: string[] };
        gate: string;
        alternatives: { supply: { partId: string; code: string | null } }[];
      };
    }>(await members[0].post('/api/loans/preview', chain.body));
    expect(pv.preview.outcome.verdict).toBe('fail');
    expect(pv.preview.gate).toBe('blocked');
    expect(pv.preview.outcome.changes.length).toBeGreaterThan(0);
    expect(
      pv.preview.alternatives.some(
        (a) => a.supply.partId === parts.supply24.id && a.supply.code === free24.code,
      ),
    ).toBe(true);
  });

  test('an override needs a steward and a written reason', async () => {
    const chain = await looseChain(parts.supply12.id, parts.led.id, 6);
    const byMember = await members[1].post('/api/loans', {
      ...chain.body,
      override: { reason: 'I know what I am doing' },
    });
    expect(byMember.status).toBe(403);
    const noReason = await steward.post('/api/loans', {
      ...chain.body,
      borrowerId: fx.members[11].id,
      override: { reason: '   ' },
    });
    expect(noReason.status).toBe(400);
    expect((await json<ErrorBody>(noReason)).error.fields).toHaveProperty(['override.reason']);
    expect(await stateOf(chain.supply.id)).toBe('on_shelf');

    const ok = await steward.post('/api/loans', {
      ...chain.body,
      borrowerId: fx.members[11].id,
      override: { reason: 'Bench demo of a failed chain, supervised' },
    });
    expect(ok.status).toBe(201);
    const { loan } = await json<{ loan: { id: string; verdict: string; overridden: boolean } }>(ok);
    expect(loan).toMatchObject({ verdict: 'fail', overridden: true });
    const row = await db.selectFrom('loans').selectAll().where('id', '=', loan.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({
      borrower_id: fx.members[11].id,
      lent_by_id: fx.steward.id,
      override_by: fx.steward.id,
      check_verdict: 'fail',
    });
    expect(row.override_reason).toBe('Bench demo of a failed chain, supervised');
    const trail = await db
      .selectFrom('audit_log')
      .select('action')
      .where('target_id', '=', loan.id)
      .execute();
    expect(trail.map((a) => a.action).sort()).toEqual(['loan.created', 'loan.override']);
  });

  test('a caution needs the acknowledgement flag', async () => {
    const chain = await looseChain(parts.supply24.id, parts.warmLed.id, 3);
    const pv = await json<{ preview: { outcome: { verdict: string }; gate: string } }>(
      await members[2].post('/api/loans/preview', chain.body),
    );
    expect(pv.preview).toMatchObject({ gate: 'acknowledge', outcome: { verdict: 'caution' } });
    const without = await members[2].post('/api/loans', chain.body);
    expect(without.status).toBe(409);
    expect((await json<ErrorBody>(without)).error.fields).toHaveProperty('acknowledgeCaution');
    expect(await stateOf(chain.supply.id)).toBe('on_shelf');
    const withAck = await members[2].post('/api/loans', { ...chain.body, acknowledgeCaution: true });
    expect(withAck.status).toBe(201);
    const { loan } = await json<{ loan: { id: string } }>(withAck);
    const row = await db
      .selectFrom('loans')
      .select(['caution_acknowledged', 'check_verdict'])
      .where('id', '=', loan.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ caution_acknowledged: true, check_verdict: 'caution' });
  });

  test('an ok chain lends at once, due at closing time in the space zone, with the report stored', async () => {
    const chain = await looseChain(parts.supply24.id, parts.led.id, 3);
    const res = await members[3].post('/api/loans', chain.body);
    expect(res.status).toBe(201);
    const { loan } = await json<{ loan: { id: string; dueAt: string; verdict: string } }>(res);
    expect(loan.verdict).toBe('ok');
    expect(chicagoWall(loan.dueAt)).toBe('19:30');
    const row = await db
      .selectFrom('loans')
      .select(['check_report'])
      .where('id', '=', loan.id)
      .executeTakeFirstOrThrow();
    expect(row.check_report).toMatchObject({
      kind: 'checked',
      report: { verdict: 'ok' },
      spec: { string: { count: 3 } },
    });
    expect(await stateOf(chain.supply.id)).toBe('out');
    const moves = await db
      .selectFrom('stock_movements')
      .select(['reason', 'qty_delta'])
      .where('ref_id', '=', loan.id)
      .where('location_id', '=', chain.ledBin.id)
      .execute();
    expect(moves).toEqual([{ reason: 'loan_out', qty_delta: -3 }]);
  });
});

describe('limits and tenancy', () => {
  test('the open-loan limit of the space holds', async () => {
    await db.updateTable('spaces').set({ max_open_loans: 1 }).where('id', '=', fx.space.id).execute();
    try {
      const a = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
      const b = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
      expect((await members[4].post('/api/loans', { unitIds: [a.id] })).status).toBe(201);
      const second = await members[4].post('/api/loans', { unitIds: [b.id] });
      expect(second.status).toBe(409);
      expect((await json<ErrorBody>(second)).error.fields).toHaveProperty('borrowerId');
      expect(await stateOf(b.id)).toBe('on_shelf');
    } finally {
      await db.updateTable('spaces').set({ max_open_loans: 3 }).where('id', '=', fx.space.id).execute();
    }
  });

  test('bad input names the field; another space answers 404', async () => {
    const bad = await members[5].post('/api/loans', { unitIds: ['not-an-id'] });
    expect(bad.status).toBe(400);
    expect(Object.keys((await json<ErrorBody>(bad)).error.fields ?? {})).toContain('unitIds.0');
    const both = await members[5].post('/api/loans', { kitBoxId: fx.space.id, unitIds: [fx.space.id] });
    expect(both.status).toBe(400);

    const other = await loanSpace(db, { members: 0 });
    const otherParts = await chainParts(db, other.space.id);
    const foreign = await makeUnit(db, other.space.id, otherParts.meter.id, other.bin.id);
    expect((await members[5].post('/api/loans', { unitIds: [foreign.id] })).status).toBe(404);
    expect((await members[5].post('/api/loans/preview', { unitIds: [foreign.id] })).status).toBe(404);
    expect(await stateOf(foreign.id)).toBe('on_shelf');
    expect((await members[5].get(`/api/loans/${fx.space.id}`)).status).toBe(404);
    expect((await members[5].get('/api/loans/not-a-uuid')).status).toBe(404);
  });

  test('nobody signed in gets 401', async () => {
    const anon = new HttpSession();
    expect((await anon.post('/api/loans', { unitIds: [] })).status).toBe(401);
    expect((await anon.get('/api/loans')).status).toBe(401);
  });
});
