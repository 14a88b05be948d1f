import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import {
  closeTestDb,
  makeLocation,
  makePart,
  makeSpace,
  makeStock,
  makeUnit,
  makeUser,
  testDb,
} from '../helpers/db';
import { HttpSession, signedIn } from '../helpers/http';

// Who may do what on the shelf, through every shelf route: anonymous 401, members read but never
// write (403), stewards and admins write; another space's records answer 404 as if they did not exist.

const db = testDb();
type Ids = {
  part: string;
  unitPart: string;
  unit: string;
  unitCode: string;
  partCode: string;
  bin: string;
  binCode: string;
  bin2: string;
  count: string;
};
let mine: Ids;
let theirs: Ids;
let member: HttpSession;
let steward: HttpSession;
let admin: HttpSession;
let treasurer: HttpSession;

async function fixture(spaceId: string): Promise<Ids> {
  const part = await makePart(db, spaceId, { name: 'Access test part' });
  const unitPart = await makePart(db, spaceId, {
    name: 'Access test meter',
    category: 'meter',
    tracking: 'unit',
  });
  const bin = await makeLocation(db, spaceId);
  const bin2 = await makeLocation(db, spaceId);
  await makeStock(db, spaceId, part.id, bin.id, 10);
  const unit = await makeUnit(db, spaceId, unitPart.id, bin.id);
  const count = await db
    .insertInto('stock_counts')
    .values({
      space_id: spaceId,
      location_id: bin.id,
      lines: JSON.stringify([{ partId: part.id, expected: 10, counted: null }]),
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return {
    count: count.id,
    part: part.id,
    unitPart: unitPart.id,
    unit: unit.id,
    unitCode: unit.code,
    partCode: part.code!,
    bin: bin.id,
    binCode: bin.code!,
    bin2: bin2.id,
  };
}

beforeAll(async () => {
  const space = await makeSpace(db);
  const other = await makeSpace(db);
  mine = await fixture(space.id);
  theirs = await fixture(other.id);
  const users = await Promise.all(
    (['member', 'steward', 'admin', 'treasurer'] as const).map((r) => makeUser(db, space.id, [r])),
  );
  [member, steward, admin, treasurer] = await Promise.all(users.map((u) => signedIn(u.email, u.password)));
});
afterAll(closeTestDb);

/** Every write of the shelf, as [method, path, body] for the records of `ids`. */
function writes(ids: Ids): [string, string, unknown][] {
  return [
    [
      'POST',
      '/api/parts',
      {
        sku: `ACC-${Math.random().toString(36).slice(2, 8)}`,
        name: 'x',
        category: 'consumable',
        tracking: 'counted',
      },
    ],
    ['PATCH', `/api/parts/${ids.part}`, { name: 'renamed' }],
    ['POST', `/api/parts/${ids.unitPart}/units`, { count: 1 }],
    ['POST', '/api/stock/receive', { partId: ids.part, locationId: ids.bin, qty: 1 }],
    [
      'POST',
      '/api/stock/move',
      { partId: ids.part, fromLocationId: ids.bin, toLocationId: ids.bin2, qty: 1 },
    ],
    ['POST', '/api/stock/adjust', { partId: ids.part, locationId: ids.bin, delta: -1, note: 'access test' }],
    ['PATCH', `/api/stock/units/${ids.unit}`, { state: 'in_repair', reason: 'access test' }],
    ['POST', '/api/stock/counts', { locationId: ids.bin2 }],
    ['POST', '/api/locations', { name: `Acc ${Math.random().toString(36).slice(2, 8)}` }],
    ['PATCH', `/api/locations/${ids.bin2}`, { kind: 'drawer' }],
    ['POST', '/api/labels', { selection: { kind: 'part', partId: ids.part } }],
    ['PATCH', `/api/stock/counts/${ids.count}`, { lines: [{ partId: ids.part, counted: 0 }] }],
    ['POST', `/api/stock/counts/${ids.count}/post`, undefined],
    ['POST', '/api/parts/import', { csv: 'sku\nX-1\n' }],
  ];
}

const send = (s: HttpSession, [method, path, body]: [string, string, unknown]) => s.post(path, body, method);

describe('roles', () => {
  test('anonymous callers get 401 on reads and writes', async () => {
    const anon = new HttpSession();
    for (const path of [
      '/api/parts',
      `/api/parts/${mine.part}`,
      '/api/locations',
      `/api/scan/${mine.unitCode}`,
      '/api/stock/repairs',
      '/api/parts/export',
    ]) {
      expect((await anon.get(path)).status, path).toBe(401);
    }
    for (const w of writes(mine)) expect((await send(anon, w)).status, `${w[0]} ${w[1]}`).toBe(401);
  });

  test('members and treasurers read the shelf but every write is 403 and changes nothing', async () => {
    for (const reader of [member, treasurer]) {
      for (const path of [
        '/api/parts',
        `/api/parts/${mine.part}`,
        '/api/locations',
        `/api/locations/${mine.bin}`,
        `/api/scan/${mine.unitCode}`,
        '/api/stock/repairs',
      ]) {
        expect((await reader.get(path)).status, path).toBe(200);
      }
      for (const w of writes(mine)) expect((await send(reader, w)).status, `${w[0]} ${w[1]}`).toBe(403);
    }
    const part = await db
      .selectFrom('parts')
      .select('name')
      .where('id', '=', mine.part)
      .executeTakeFirstOrThrow();
    expect(part.name).toBe('Access test part');
    const stock = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', mine.part)
      .where('location_id', '=', mine.bin)
      .executeTakeFirstOrThrow();
    expect(stock.qty).toBe(10);
  });

  test('stewards and admins may write', async () => {
    expect(
      (await steward.post('/api/stock/receive', { partId: mine.part, locationId: mine.bin, qty: 1 })).status,
    ).toBe(200);
    expect(
      (
        await admin.post('/api/stock/adjust', {
          partId: mine.part,
          locationId: mine.bin,
          delta: -1,
          note: 'admin check',
        })
      ).status,
    ).toBe(200);
  });
});

describe('tenancy', () => {
  test('a malformed id in the path is a plain 404, never a server error', async () => {
    const cases: [string, string, unknown][] = [
      ['GET', '/api/parts/not-a-uuid', undefined],
      ['PATCH', '/api/parts/not-a-uuid', { name: 'x' }],
      ['POST', '/api/parts/123/units', { count: 1 }],
      ['GET', '/api/locations/zzz', undefined],
      ['DELETE', '/api/locations/zzz', undefined],
      ['PATCH', '/api/stock/units/zzz', { state: 'in_repair', reason: 'test' }],
      ['GET', '/api/stock/counts/zzz', undefined],
      ['POST', '/api/stock/counts/zzz/post', undefined],
      ['GET', '/api/attachments/zzz', undefined],
    ];
    for (const [method, path, body] of cases) {
      expect((await steward.post(path, body, method)).status, `${method} ${path}`).toBe(404);
    }
  });

  test("another space's part, unit, bin and attachment ids answer 404 to reads", async () => {
    for (const path of [
      `/api/parts/${theirs.part}`,
      `/api/locations/${theirs.bin}`,
      `/api/stock/counts/${theirs.count}`,
    ]) {
      expect((await steward.get(path)).status, path).toBe(404);
    }
  });

  test("another space's label codes do not resolve, for scans and for label runs", async () => {
    expect((await member.get(`/api/scan/${theirs.unitCode}`)).status).toBe(404);
    expect((await member.get(`/api/scan/${theirs.binCode}`)).status).toBe(404);
    const found = (await (
      await member.post('/api/scan', { codes: [theirs.partCode, mine.partCode] })
    ).json()) as { found: { code: string }[] };
    expect(found.found.map((f) => f.code)).toEqual([mine.partCode]);
    const labels = await steward.post('/api/labels', {
      selection: { kind: 'codes', codes: [mine.unitCode, theirs.unitCode] },
    });
    expect(labels.status).toBe(400);
    const body = (await labels.json()) as { error: { fields: Record<string, string[]> } };
    expect(Object.keys(body.error.fields)).toEqual(['selection.codes.1']);
  });

  test("every write aimed at another space's records answers 404 and changes nothing there", async () => {
    for (const w of writes(theirs).filter(
      ([, path]) => path !== '/api/parts' && path !== '/api/locations' && path !== '/api/parts/import',
    )) {
      expect((await send(steward, w)).status, `${w[0]} ${w[1]}`).toBe(404);
    }
    // Mixing: my part into their bin.
    expect(
      (await steward.post('/api/stock/receive', { partId: mine.part, locationId: theirs.bin, qty: 1 }))
        .status,
    ).toBe(404);
    const stock = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', theirs.part)
      .where('location_id', '=', theirs.bin)
      .executeTakeFirstOrThrow();
    expect(stock.qty).toBe(10);
    const unit = await db
      .selectFrom('units')
      .select('state')
      .where('id', '=', theirs.unit)
      .executeTakeFirstOrThrow();
    expect(unit.state).toBe('on_shelf');
  });
});
