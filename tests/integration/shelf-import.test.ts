import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import Papa from 'papaparse';
import { closeTestDb, makeLocation, makeSpace, makeUser, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// CSV import and export over real HTTP: the preview names each bad row and field, the commit is all
// or nothing in one transaction, and the export re-imports.

const db = testDb();
let spaceId: string;
let steward: HttpSession;
let member: HttpSession;
let bin: { id: string; code: string | null; name: string };

type ErrorBody = { error: { code: string; message: string; fields: Record<string, string[]> } };

beforeAll(async () => {
  const space = await makeSpace(db);
  spaceId = space.id;
  const s = await makeUser(db, spaceId, ['steward']);
  const m = await makeUser(db, spaceId, ['member']);
  steward = await signedIn(s.email, s.password);
  member = await signedIn(m.email, m.password);
  bin = await makeLocation(db, spaceId, 'Import bin');
});
afterAll(closeTestDb);

const HEAD =
  'sku,name,category,tracking,spec.type,spec.minInputVolts,spec.maxInputVolts,spec.outputAmps,spec.vfMin,spec.vfTyp,spec.vfMax,spec.maxAmps,spec.maxWatts,location,qty';
const good = (sku: string) => `${sku},Good LED,led,counted,,,,,2.8,3.1,3.5,0.35,1.2,${bin.code},25`;
const driver = (sku: string) => `${sku},Good driver,driver,unit,buck,6,36,0.35,,,,,,Import bin,2`;

async function partsInSpace() {
  return db
    .selectFrom('parts')
    .select(['sku', 'id', 'code', 'tracking'])
    .where('space_id', '=', spaceId)
    .execute();
}

describe('CSV import', () => {
  test('one bad row: the preview names row and field, and the commit writes nothing at all', async () => {
    const csv = [
      HEAD,
      good('IMP-1'),
      driver('IMP-2'),
      'IMP-3,Bad driver,driver,unit,buck,6,,0.35,,,,,,Import bin,1',
    ].join('\n');
    const preview = await steward.post('/api/parts/import', { csv });
    expect(preview.status).toBe(200);
    const check = (await preview.json()) as {
      rows: { row: number }[];
      errors: { row: number; field: string }[];
    };
    expect(check.errors).toEqual([expect.objectContaining({ row: 4, field: 'specs.maxInputVolts' })]);
    expect(check.rows.map((r) => r.row)).toEqual([2, 3]);

    const before = await db
      .selectFrom('label_codes')
      .select('code')
      .where('space_id', '=', spaceId)
      .execute();
    const commit = await steward.post('/api/parts/import?commit=1', { csv });
    expect(commit.status).toBe(400);
    const body = (await commit.json()) as ErrorBody;
    expect(body.error.fields).toHaveProperty(['rows.4.specs.maxInputVolts']);
    expect(body.error.message).toMatch(/nothing was imported/);

    expect(await partsInSpace()).toEqual([]);
    expect(await db.selectFrom('stock').select('qty').where('space_id', '=', spaceId).execute()).toEqual([]);
    expect(await db.selectFrom('units').select('id').where('space_id', '=', spaceId).execute()).toEqual([]);
    expect(
      await db.selectFrom('label_codes').select('code').where('space_id', '=', spaceId).execute(),
    ).toHaveLength(before.length);
  });

  test('a clean file commits every row: parts with codes, stock in the bin, labelled units', async () => {
    const csv = [HEAD, good('IMP-10'), driver('IMP-11')].join('\r\n');
    const res = await steward.post('/api/parts/import?commit=1', { csv });
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ created: 2, updated: 0, received: 27, rows: 2 });
    const parts = await partsInSpace();
    const led = parts.find((p) => p.sku === 'IMP-10')!;
    const drv = parts.find((p) => p.sku === 'IMP-11')!;
    expect(led.code).toMatch(/^[0-9A-Z*~$=]{7}$/);
    const stock = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', led.id)
      .where('location_id', '=', bin.id)
      .executeTakeFirstOrThrow();
    expect(stock.qty).toBe(25);
    const units = await db
      .selectFrom('units')
      .select(['code', 'location_id'])
      .where('part_id', '=', drv.id)
      .execute();
    expect(units).toHaveLength(2);
    expect(units.every((u) => u.location_id === bin.id && u.code.length === 7)).toBe(true);

    // The same SKU again updates the part and adds stock rather than failing.
    const again = await steward.post('/api/parts/import?commit=1', {
      csv: `sku,qty,location,reorder_point\nIMP-10,5,${bin.code},30\n`,
    });
    expect(again.status).toBe(201);
    expect(await again.json()).toMatchObject({ created: 0, updated: 1, received: 5 });
    const after = await db
      .selectFrom('stock')
      .select('qty')
      .where('part_id', '=', led.id)
      .executeTakeFirstOrThrow();
    expect(after.qty).toBe(30);
  });

  test('an empty body and an oversized field are 400s naming csv', async () => {
    for (const body of [{}, { csv: '' }]) {
      const res = await steward.post('/api/parts/import', body);
      expect(res.status).toBe(400);
      expect(((await res.json()) as ErrorBody).error.fields).toHaveProperty('csv');
    }
  });

  test('members cannot import (403) and nothing is read from their file', async () => {
    const res = await member.post('/api/parts/import?commit=1', { csv: [HEAD, good('IMP-M')].join('\n') });
    expect(res.status).toBe(403);
    expect((await partsInSpace()).some((p) => p.sku === 'IMP-M')).toBe(false);
  });
});

describe('CSV export', () => {
  test('exports the filtered table as CSV that any member may download', async () => {
    const res = await member.get('/api/parts/export?category=led');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(res.headers.get('content-disposition')).toMatch(
      /^attachment; filename="parts-\d{4}-\d{2}-\d{2}\.csv"$/,
    );
    const rows = Papa.parse<Record<string, string>>((await res.text()).replace(/^\ufeff/, ''), {
      header: true,
      skipEmptyLines: true,
    }).data;
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.category === 'led')).toBe(true);
    expect(rows.find((r) => r.sku === 'IMP-10')).toMatchObject({ on_hand: '30', 'spec.vfTyp': '3.1' });
  });
});
