import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeLocation, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeStock, makeUnit, type ErrorBody } from './loans-fixtures';

// A kit box's life through real HTTP: built from a template (stock leaves the shelf), borrowed, held
// by someone else, returned short (the shortfall becomes a 'lost' movement and the box waits in repair),
// refilled (the hold becomes ready and its holder is e-mailed), borrowed by the holder. Then a loose
// loan returned with a damaged unit, and the renewal rules.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let steward: HttpSession;
let alice: HttpSession;
let bruno: HttpSession;
let boxId: string;
let templateId: string;
let ledBin: string;

type LoanJson = {
  loan: {
    id: string;
    status: string;
    lines: { id: string; partId: string; qty: number; chainRole: string | null; unitCode: string | null }[];
  };
};

beforeAll(async () => {
  fx = await loanSpace(db, { members: 2 });
  parts = await chainParts(db, fx.space.id);
  for (let i = 0; i < 3; i++) {
    await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    await makeUnit(db, fx.space.id, parts.driver.id, fx.bin.id);
  }
  ledBin = (await makeLocation(db, fx.space.id)).id;
  await makeStock(db, fx.space.id, parts.led.id, ledBin, 20);
  steward = await login(fx.steward);
  [alice, bruno] = await Promise.all(fx.members.map(login));
});
afterAll(closeTestDb);

const boxState = async () =>
  (await db.selectFrom('kit_boxes').select('state').where('id', '=', boxId).executeTakeFirstOrThrow()).state;
const ledQty = async () =>
  (
    await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', parts.led.id)
      .where('location_id', '=', ledBin)
      .executeTakeFirstOrThrow()
  ).qty;

describe('kit box', () => {
  test('a steward makes a template and builds a box: units and counted stock leave the shelf', async () => {
    const member = await alice.post('/api/kits/templates', {
      name: 'Nope',
      lines: [{ partId: parts.led.id, qty: 1 }],
    });
    expect(member.status).toBe(403);
    const wrongRole = await steward.post('/api/kits/templates', {
      name: 'Bad roles',
      lines: [{ partId: parts.led.id, qty: 3, chainRole: 'supply' }],
    });
    expect(wrongRole.status).toBe(400);
    expect((await json<ErrorBody>(wrongRole)).error.fields).toHaveProperty(['lines.0.chainRole']);

    const t = await steward.post('/api/kits/templates', {
      name: 'Test desk lamp',
      teachingNotes: 'Wire the stars in series.',
      cautions: 'Do not look into the LEDs.',
      lines: [
        { partId: parts.supply24.id, qty: 1, chainRole: 'supply' },
        { partId: parts.driver.id, qty: 1, chainRole: 'driver' },
        { partId: parts.led.id, qty: 3, chainRole: 'led' },
      ],
    });
    expect(t.status).toBe(201);
    templateId = (await json<{ template: { id: string } }>(t)).template.id;

    const before = await ledQty();
    const b = await steward.post('/api/kits/boxes', { templateId });
    expect(b.status).toBe(201);
    const box = (await json<{ box: { id: string; code: string } }>(b)).box;
    boxId = box.id;
    expect(await ledQty()).toBe(before - 3);
    const contents = await db
      .selectFrom('kit_box_contents')
      .select(['part_id', 'unit_id', 'qty', 'chain_role'])
      .where('kit_box_id', '=', boxId)
      .execute();
    expect(contents).toHaveLength(3);
    const units = await db
      .selectFrom('units')
      .select(['kit_box_id', 'location_id'])
      .where('kit_box_id', '=', boxId)
      .execute();
    expect(units).toHaveLength(2);
    expect(units.every((u) => u.location_id === null)).toBe(true);
    const moves = await db
      .selectFrom('stock_movements')
      .select(['reason', 'qty_delta', 'location_id'])
      .where('ref_id', '=', boxId)
      .execute();
    expect(moves.filter((m) => m.location_id === ledBin)).toEqual([
      { reason: 'kit_build', qty_delta: -3, location_id: ledBin },
    ]);
    const label = await db
      .selectFrom('label_codes')
      .select(['kind', 'target_id'])
      .where('code', '=', box.code)
      .executeTakeFirstOrThrow();
    expect(label).toEqual({ kind: 'kit_box', target_id: boxId });

    const page = await json<{ check: { verdict: string; available: boolean } }>(
      await alice.get(`/api/kits/boxes/${boxId}`),
    );
    expect(page.check).toMatchObject({ verdict: 'ok', available: true });
  });

  test('borrowed, held by another member, not renewable while held', async () => {
    const res = await alice.post('/api/loans', { kitBoxId: boxId });
    expect(res.status).toBe(201);
    expect(await boxState()).toBe('out');
    const again = await bruno.post('/api/loans', { kitBoxId: boxId });
    expect(again.status).toBe(409);

    const ownHold = await alice.post('/api/holds', { kitBoxId: boxId });
    expect(ownHold.status).toBe(409);
    const hold = await bruno.post('/api/holds', { kitBoxId: boxId });
    expect(hold.status).toBe(201);
    expect((await json<{ hold: { position: number } }>(hold)).hold.position).toBe(1);
    expect((await bruno.post('/api/holds', { kitBoxId: boxId })).status).toBe(409);

    const { loans } = await json<{ loans: { id: string }[] }>(await alice.get('/api/loans'));
    const renew = await alice.post(`/api/loans/${loans[0].id}/renew`);
    expect(renew.status).toBe(409);
  });

  test('returned with one LED missing: a lost movement, the box waits in repair, the hold waits', async () => {
    const { loans } = await json<{ loans: { id: string }[] }>(await alice.get('/api/loans'));
    const loanId = loans[0].id;
    const { loan } = await json<LoanJson>(await steward.get(`/api/loans/${loanId}`));
    // Bruno is neither borrower nor steward: the loan does not exist for him.
    expect((await bruno.get(`/api/loans/${loanId}`)).status).toBe(404);
    expect((await bruno.post(`/api/loans/${loanId}/return`, {})).status).toBe(404);

    const lines = loan.lines.map((l) =>
      l.chainRole === 'led'
        ? { lineId: l.id, returnedQty: l.qty - 1, condition: 'missing' }
        : { lineId: l.id, returnedQty: l.qty, condition: 'ok' },
    );
    const incomplete = await steward.post(`/api/loans/${loanId}/return`, { lines: lines.slice(1) });
    expect(incomplete.status).toBe(400);
    const res = await steward.post(`/api/loans/${loanId}/return`, { lines });
    expect(res.status).toBe(200);
    expect((await json<{ return: { status: string } }>(res)).return.status).toBe('returned_short');
    expect((await steward.post(`/api/loans/${loanId}/return`, { lines })).status).toBe(409);

    const lost = await db
      .selectFrom('stock_movements')
      .select(['reason', 'qty_delta', 'part_id'])
      .where('ref_id', '=', loanId)
      .where('reason', '=', 'lost')
      .execute();
    expect(lost).toEqual([{ reason: 'lost', qty_delta: -1, part_id: parts.led.id }]);
    const ledInBox = await db
      .selectFrom('kit_box_contents')
      .select('qty')
      .where('kit_box_id', '=', boxId)
      .where('part_id', '=', parts.led.id)
      .executeTakeFirstOrThrow();
    expect(ledInBox.qty).toBe(2);
    expect(await boxState()).toBe('in_repair');
    const units = await db.selectFrom('units').select('state').where('kit_box_id', '=', boxId).execute();
    expect(units.map((u) => u.state)).toEqual(['on_shelf', 'on_shelf']);
    const hold = await db
      .selectFrom('holds')
      .select('status')
      .where('kit_box_id', '=', boxId)
      .executeTakeFirstOrThrow();
    expect(hold.status).toBe('waiting');
    const trail = await db.selectFrom('audit_log').select('action').where('target_id', '=', loanId).execute();
    expect(trail.map((t) => t.action)).toContain('loan.returned');
  });

  test('refilled: the hold becomes ready, its holder is e-mailed, and only the holder can take it', async () => {
    const before = await ledQty();
    const res = await steward.post(`/api/kits/boxes/${boxId}/refill`, {});
    expect(res.status).toBe(200);
    expect(await ledQty()).toBe(before - 1);
    expect(await boxState()).toBe('held');
    const mail = await waitForMessage({
      to: fx.members[1].email,
      match: (m) => m.subject.startsWith('Ready for you'),
      timeoutMs: 10_000,
    });
    expect(mail.text).toContain('Test desk lamp box 1');
    const hold = await db
      .selectFrom('holds')
      .select(['status', 'notified_at'])
      .where('kit_box_id', '=', boxId)
      .executeTakeFirstOrThrow();
    expect(hold.status).toBe('ready');
    expect(hold.notified_at).not.toBeNull();

    expect((await alice.post('/api/loans', { kitBoxId: boxId })).status).toBe(409);
    expect((await bruno.post('/api/loans', { kitBoxId: boxId })).status).toBe(201);
    const done = await db
      .selectFrom('holds')
      .select('status')
      .where('kit_box_id', '=', boxId)
      .executeTakeFirstOrThrow();
    expect(done.status).toBe('fulfilled');
  });
});

describe('loose loan', () => {
  test('a damaged unit goes to repair, a short counted line returns what came back', async () => {
    const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const before = await ledQty();
    const res = await alice.post('/api/loans', {
      unitIds: [meter.id],
      counted: [{ partId: parts.led.id, locationId: ledBin, qty: 4 }],
    });
    expect(res.status).toBe(201);
    const loanId = (await json<{ loan: { id: string } }>(res)).loan.id;
    expect(await ledQty()).toBe(before - 4);

    const renew1 = await alice.post(`/api/loans/${loanId}/renew`);
    expect(renew1.status).toBe(200);
    const renew2 = await alice.post(`/api/loans/${loanId}/renew`);
    expect(renew2.status).toBe(409);

    const { loan } = await json<LoanJson>(await alice.get(`/api/loans/${loanId}`));
    const lines = loan.lines.map((l) =>
      l.partId === parts.meter.id
        ? { lineId: l.id, returnedQty: 0, condition: 'damaged' }
        : { lineId: l.id, returnedQty: 3, condition: 'missing' },
    );
    const tooMany = await steward.post(`/api/loans/${loanId}/return`, {
      lines: lines.map((l) => ({ ...l, returnedQty: 9 })),
    });
    expect(tooMany.status).toBe(400);
    const ret = await steward.post(`/api/loans/${loanId}/return`, { lines });
    expect(ret.status).toBe(200);
    expect(await ledQty()).toBe(before - 1);
    const unit = await db
      .selectFrom('units')
      .select('state')
      .where('id', '=', meter.id)
      .executeTakeFirstOrThrow();
    expect(unit.state).toBe('in_repair');
    const moves = await db
      .selectFrom('stock_movements')
      .select(['reason', 'qty_delta', 'location_id'])
      .where('ref_id', '=', loanId)
      .orderBy('id')
      .execute();
    expect(moves).toEqual(
      expect.arrayContaining([
        { reason: 'loan_return', qty_delta: 3, location_id: ledBin },
        { reason: 'lost', qty_delta: -1, location_id: null },
        { reason: 'damaged', qty_delta: 0, location_id: null },
      ]),
    );
  });
});
