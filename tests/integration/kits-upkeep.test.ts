import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { formatDateTime } from '@/lib/format';
import { closeTestDb, makeLocation, makePart, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import {
  BUCK_350,
  chainParts,
  json,
  loanSpace,
  login,
  makeStock,
  makeUnit,
  type ErrorBody,
} from './loans-fixtures';

// Short returns and box upkeep through real HTTP: three boxes come back short (each with a note) and
// all three are out of service on Repairs and Today; a steward takes a unit out, swaps one, takes a
// box apart; after the template's driver changes, a refill replaces the old driver rather than adding
// the new one beside it, so the box's check runs again.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let steward: HttpSession;
let member: HttpSession;
let templateId: string;
let ledBin: string;
const boxes: { id: string; name: string }[] = [];

type LoanJson = { loan: { id: string; lines: { id: string; qty: number; chainRole: string | null }[] } };
type RepairsJson = {
  units: unknown[];
  boxes: {
    id: string;
    name: string;
    shortfall: { name: string; missing: number }[];
    lastReturn: { note: string; lines: { part: string; qty: number; condition: string }[] } | null;
  }[];
};

const boxState = async (id: string) =>
  (await db.selectFrom('kit_boxes').select('state').where('id', '=', id).executeTakeFirstOrThrow()).state;
const contentsOf = (id: string) =>
  db
    .selectFrom('kit_box_contents')
    .select(['part_id', 'unit_id', 'qty', 'chain_role'])
    .where('kit_box_id', '=', id)
    .execute();
const textOf = (html: string) =>
  html
    .replace(/<!-- -->/g, '')
    .replace(/<[^>]+>/g, ' ')
    .replace(/\s+/g, ' ');

beforeAll(async () => {
  fx = await loanSpace(db, { members: 1 });
  parts = await chainParts(db, fx.space.id);
  for (let i = 0; i < 5; i++) {
    await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    await makeUnit(db, fx.space.id, parts.driver.id, fx.bin.id);
  }
  ledBin = (await makeLocation(db, fx.space.id)).id;
  await makeStock(db, fx.space.id, parts.led.id, ledBin, 30);
  steward = await login(fx.steward);
  member = await login(fx.members[0]);
  const t = await steward.post('/api/kits/templates', {
    name: 'Upkeep lamp',
    lines: [
      { partId: parts.supply24.id, qty: 1, chainRole: 'supply' },
      { partId: parts.driver.id, qty: 1, chainRole: 'driver' },
      { partId: parts.led.id, qty: 3, chainRole: 'led' },
    ],
  });
  expect(t.status).toBe(201);
  templateId = (await json<{ template: { id: string } }>(t)).template.id;
  for (let i = 0; i < 3; i++) {
    const b = await steward.post('/api/kits/boxes', { templateId, name: `Upkeep box ${i + 1}` });
    expect(b.status).toBe(201);
    boxes.push({ id: (await json<{ box: { id: string } }>(b)).box.id, name: `Upkeep box ${i + 1}` });
  }
});
afterAll(closeTestDb);

async function lendAndReturnShort(boxId: string, note: string) {
  const res = await member.post('/api/loans', { kitBoxId: boxId });
  expect(res.status).toBe(201);
  const loanId = (await json<{ loan: { id: string } }>(res)).loan.id;
  const { loan } = await json<LoanJson>(await steward.get(`/api/loans/${loanId}`));
  const lines = loan.lines.map((l) =>
    l.chainRole === 'led'
      ? { lineId: l.id, returnedQty: l.qty - 1, condition: 'missing' }
      : { lineId: l.id, returnedQty: l.qty, condition: 'ok' },
  );
  const ret = await steward.post(`/api/loans/${loanId}/return`, { lines, note });
  expect(ret.status).toBe(200);
}

describe('short returns', () => {
  test('three boxes returned short are all out of service on Repairs and Today, with what is missing and the note', async () => {
    for (const [i, b] of boxes.entries())
      await lendAndReturnShort(b.id, `star ${i + 1} rolled under the bench`);
    const repairs = await json<RepairsJson>(await steward.get('/api/stock/repairs'));
    expect(repairs.boxes.map((b) => b.name).sort()).toEqual(boxes.map((b) => b.name));
    for (const [i, b] of boxes.entries()) {
      const row = repairs.boxes.find((r) => r.id === b.id)!;
      expect(row.shortfall).toEqual([{ partId: parts.led.id, name: parts.led.name, missing: 1 }]);
      expect(row.lastReturn?.note).toBe(`star ${i + 1} rolled under the bench`);
      expect(row.lastReturn?.lines).toEqual([{ part: parts.led.name, qty: 1, condition: 'missing' }]);
    }

    const today = textOf(await (await steward.get('/today')).text());
    expect(today).toContain('3 out of service');
    expect(today).toContain('3 kit boxes, 0 units in repair');
    for (const b of boxes) expect(today).toContain(b.name);
    expect(today).toContain(`Lacks 1 × ${parts.led.name}`);
    expect(today).toContain('star 2 rolled under the bench');

    const page = textOf(await (await steward.get('/shelf/repairs')).text());
    for (const b of boxes) expect(page).toContain(b.name);
  });

  test('a refilled box is back in service and leaves the lists', async () => {
    const res = await steward.post(`/api/kits/boxes/${boxes[0].id}/refill`, {});
    expect(res.status).toBe(200);
    expect(await boxState(boxes[0].id)).toBe('on_shelf');
    const repairs = await json<RepairsJson>(await steward.get('/api/stock/repairs'));
    expect(repairs.boxes.map((b) => b.id)).not.toContain(boxes[0].id);
  });
});

describe('box upkeep', () => {
  test('a unit taken out goes to repair; the box, now short, goes out of service; one audit row', async () => {
    const box = boxes[0];
    const driverRow = (await contentsOf(box.id)).find((c) => c.part_id === parts.driver.id)!;
    expect(
      (await member.post(`/api/kits/boxes/${box.id}/contents`, { unitId: driverRow.unit_id })).status,
    ).toBe(403);
    const bad = await steward.post(`/api/kits/boxes/${box.id}/contents`, { to: 'shelf' });
    expect(bad.status).toBe(400);
    expect((await json<ErrorBody>(bad)).error.fields).toHaveProperty('unitId');

    const res = await steward.post(`/api/kits/boxes/${box.id}/contents`, {
      unitId: driverRow.unit_id,
      to: 'repair',
      reason: 'output flickers',
    });
    expect(res.status).toBe(200);
    const unit = await db
      .selectFrom('units')
      .select(['state', 'kit_box_id', 'notes'])
      .where('id', '=', driverRow.unit_id!)
      .executeTakeFirstOrThrow();
    expect(unit).toEqual({ state: 'in_repair', kit_box_id: null, notes: 'output flickers' });
    expect((await contentsOf(box.id)).some((c) => c.unit_id === driverRow.unit_id)).toBe(false);
    expect(await boxState(box.id)).toBe('in_repair');
    const trail = await db
      .selectFrom('audit_log')
      .select(['action', 'detail'])
      .where('target_id', '=', box.id)
      .where('action', '=', 'kit_box.taken_out')
      .execute();
    expect(trail).toHaveLength(1);
    expect(trail[0].detail).toMatchObject({ name: box.name, to: 'to repair', reason: 'output flickers' });

    const repairs = await json<RepairsJson>(await steward.get('/api/stock/repairs'));
    expect(repairs.boxes.find((b) => b.id === box.id)?.shortfall).toEqual([
      { partId: parts.driver.id, name: parts.driver.name, missing: 1 },
    ]);
    expect(repairs.units).toHaveLength(1);
  });

  test('some of a counted part goes back into a bin', async () => {
    const box = boxes[1];
    const before = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', parts.led.id)
      .where('location_id', '=', ledBin)
      .executeTakeFirstOrThrow();
    const tooMany = await steward.post(`/api/kits/boxes/${box.id}/contents`, {
      partId: parts.led.id,
      qty: 9,
    });
    expect(tooMany.status).toBe(400);
    expect((await json<ErrorBody>(tooMany)).error.fields).toHaveProperty('qty');
    const res = await steward.post(`/api/kits/boxes/${box.id}/contents`, {
      partId: parts.led.id,
      qty: 1,
      locationId: ledBin,
    });
    expect(res.status).toBe(200);
    const after = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', parts.led.id)
      .where('location_id', '=', ledBin)
      .executeTakeFirstOrThrow();
    expect(after.qty).toBe(before.qty + 1);
    expect((await contentsOf(box.id)).find((c) => c.part_id === parts.led.id)?.qty).toBe(1);
  });

  test('a unit is swapped for a spare of the same part, never for another part', async () => {
    const box = boxes[1];
    const supplyRow = (await contentsOf(box.id)).find((c) => c.part_id === parts.supply24.id)!;
    const spare = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    const wrong = await makeUnit(db, fx.space.id, parts.supply12.id, fx.bin.id);
    const refused = await steward.post(`/api/kits/boxes/${box.id}/contents`, {
      unitId: supplyRow.unit_id,
      replacementUnitId: wrong.id,
    });
    expect(refused.status).toBe(400);
    expect((await json<ErrorBody>(refused)).error.fields).toHaveProperty('replacementUnitId');

    const res = await steward.post(`/api/kits/boxes/${box.id}/contents`, {
      unitId: supplyRow.unit_id,
      replacementUnitId: spare.id,
      to: 'shelf',
      locationId: fx.bin.id,
    });
    expect(res.status).toBe(200);
    const supplies = (await contentsOf(box.id)).filter((c) => c.part_id === parts.supply24.id);
    expect(supplies).toEqual([
      { part_id: parts.supply24.id, unit_id: spare.id, qty: 1, chain_role: 'supply' },
    ]);
    const old = await db
      .selectFrom('units')
      .select(['state', 'kit_box_id', 'location_id'])
      .where('id', '=', supplyRow.unit_id!)
      .executeTakeFirstOrThrow();
    expect(old).toEqual({ state: 'on_shelf', kit_box_id: null, location_id: fx.bin.id });
    const trail = await db
      .selectFrom('audit_log')
      .select('action')
      .where('target_id', '=', box.id)
      .where('action', '=', 'kit_box.unit_swapped')
      .execute();
    expect(trail).toHaveLength(1);
  });

  test('after the template’s driver changes, refill replaces the old driver and the check runs', async () => {
    const box = boxes[2];
    const driver2 = await makePart(db, fx.space.id, {
      name: '350 mA second test driver',
      category: 'driver',
      tracking: 'unit',
      specs: BUCK_350,
    });
    await makeUnit(db, fx.space.id, driver2.id, fx.bin.id);
    const oldDriver = (await contentsOf(box.id)).find((c) => c.part_id === parts.driver.id)!;
    const put = await steward.post(
      `/api/kits/templates/${templateId}`,
      {
        name: 'Upkeep lamp',
        lines: [
          { partId: parts.supply24.id, qty: 1, chainRole: 'supply' },
          { partId: driver2.id, qty: 1, chainRole: 'driver' },
          { partId: parts.led.id, qty: 3, chainRole: 'led' },
        ],
      },
      'PUT',
    );
    expect(put.status).toBe(200);
    const res = await steward.post(`/api/kits/boxes/${box.id}/refill`, {});
    expect(res.status).toBe(200);
    const drivers = (await contentsOf(box.id)).filter((c) => c.chain_role === 'driver');
    expect(drivers.map((d) => d.part_id)).toEqual([driver2.id]);
    expect((await contentsOf(box.id)).some((c) => c.part_id === parts.driver.id)).toBe(false);
    const old = await db
      .selectFrom('units')
      .select(['state', 'kit_box_id'])
      .where('id', '=', oldDriver.unit_id!)
      .executeTakeFirstOrThrow();
    expect(old).toEqual({ state: 'on_shelf', kit_box_id: null });
    expect(await boxState(box.id)).toBe('on_shelf');
    const page = await json<{ check: { verdict: string } }>(await steward.get(`/api/kits/boxes/${box.id}`));
    expect(page.check.verdict).toBe('ok');
    // The old driver is an ordinary shelf unit now: it can be retired.
    const retire = await steward.post(
      `/api/stock/units/${oldDriver.unit_id}`,
      { state: 'retired', reason: 'replaced in the kit' },
      'PATCH',
    );
    expect(retire.status).toBe(200);
  });

  test('a box is taken apart: contents back on the shelf, box retired; not while out on loan', async () => {
    const lent = await member.post('/api/loans', { kitBoxId: boxes[2].id });
    expect(lent.status).toBe(201);
    expect((await steward.post(`/api/kits/boxes/${boxes[2].id}/take-apart`, {})).status).toBe(409);

    const box = boxes[1];
    const inside = await contentsOf(box.id);
    const res = await steward.post(`/api/kits/boxes/${box.id}/take-apart`, {
      locationId: ledBin,
      reason: 'kit retired',
    });
    expect(res.status).toBe(200);
    expect(await contentsOf(box.id)).toEqual([]);
    expect(await boxState(box.id)).toBe('retired');
    const units = await db
      .selectFrom('units')
      .select(['state', 'kit_box_id'])
      .where(
        'id',
        'in',
        inside.filter((c) => c.unit_id).map((c) => c.unit_id!),
      )
      .execute();
    expect(units.every((u) => u.state === 'on_shelf' && u.kit_box_id === null)).toBe(true);
    const trail = await db
      .selectFrom('audit_log')
      .select('action')
      .where('target_id', '=', box.id)
      .where('action', '=', 'kit_box.taken_apart')
      .execute();
    expect(trail).toHaveLength(1);
    expect((await steward.post(`/api/kits/boxes/${box.id}/take-apart`, {})).status).toBe(409);
  });
});

describe('the loans audit trail', () => {
  test('names the box and the borrower, says what was missing, and shows the due date in the space’s time', async () => {
    const loan = await db
      .selectFrom('loans')
      .select(['due_at'])
      .where('kit_box_id', '=', boxes[2].id)
      .where('status', '=', 'out')
      .executeTakeFirstOrThrow();
    const local = formatDateTime(loan.due_at, fx.space.time_zone);
    const page = textOf(await (await steward.get('/loans/audit')).text());
    expect(page).toContain(`${boxes[2].name} to Test member 1 · check ok · due ${local}`);
    expect(page).toContain(
      `${boxes[0].name} from Test member 1 · back short · 1 × ${parts.led.name} missing · note “star 1 rolled under the bench”`,
    );
    expect(page).toContain(`${boxes[1].name} · back on the shelf:`);
  });
});
