import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { PDFDocument } from 'pdf-lib';
import { verifyCode } from '@/labels/code';
import {
  closeTestDb,
  makeLocation,
  makePart,
  makeSpace,
  makeStock,
  makeUser,
  testDb,
  uniq,
} from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// The shelf's main paths through real HTTP and PostgreSQL: parts with checked specs, labelled units,
// label PDFs, code resolution, unit states, bins and stock counts.

const db = testDb();
let spaceId: string;
let steward: HttpSession;
let member: HttpSession;

type ErrorBody = { error: { code: string; message: string; fields: Record<string, string[]> } };
const fieldsOf = async (res: Response) => ((await res.json()) as ErrorBody).error.fields;

beforeAll(async () => {
  const space = await makeSpace(db);
  spaceId = space.id;
  const s = await makeUser(db, spaceId, ['steward']);
  const m = await makeUser(db, spaceId, ['member']);
  [steward, member] = await Promise.all([signedIn(s.email, s.password), signedIn(m.email, m.password)]);
});
afterAll(closeTestDb);

const BUCK = { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 };

describe('parts', () => {
  test('a driver without its input maximum is refused, naming specs.maxInputVolts', async () => {
    const res = await steward.post('/api/parts', {
      sku: uniq('DRV'),
      name: 'Driver',
      category: 'driver',
      tracking: 'unit',
      specs: { type: 'buck', minInputVolts: 6, outputAmps: 0.35 },
    });
    expect(res.status).toBe(400);
    expect(Object.keys(await fieldsOf(res))).toEqual(['specs.maxInputVolts']);
  });

  test('a price past the 32-bit column is a 400 naming priceMinor, not a 500 (found by the generated examples)', async () => {
    for (const priceMinor of [2 ** 31, 7_794_911_290_064_896]) {
      const res = await steward.post('/api/parts', { sku: uniq('BIG'), name: 'Dear part', category: 'consumable', tracking: 'counted', sellable: true, priceMinor });
      expect(res.status).toBe(400);
      expect(Object.keys(await fieldsOf(res))).toEqual(['priceMinor']);
    }
    const ok = await steward.post('/api/parts', { sku: uniq('BIG'), name: 'Dear part', category: 'consumable', tracking: 'counted', sellable: true, priceMinor: 100_000_000 });
    expect(ok.status).toBe(201);
  });

  test('a labelled part is created with its code and first units; its SKU cannot be reused (409 sku)', async () => {
    const bin = await makeLocation(db, spaceId);
    const sku = uniq('DRV');
    const res = await steward.post('/api/parts', {
      sku,
      name: 'Test buck driver',
      category: 'driver',
      tracking: 'unit',
      specs: BUCK,
      units: 3,
      locationId: bin.id,
    });
    expect(res.status).toBe(201);
    const made = (await res.json()) as { id: string; code: string; units: { id: string; code: string }[] };
    expect(verifyCode(made.code).ok).toBe(true);
    expect(made.units).toHaveLength(3);
    expect(new Set(made.units.map((u) => u.code)).size).toBe(3);
    const labels = await db
      .selectFrom('label_codes')
      .select(['code', 'kind'])
      .where('target_id', 'in', [made.id, ...made.units.map((u) => u.id)])
      .execute();
    expect(labels.map((l) => l.kind).sort()).toEqual(['part', 'unit', 'unit', 'unit']);

    const dup = await steward.post('/api/parts', { sku, name: 'Again', category: 'tool', tracking: 'unit' });
    expect(dup.status).toBe(409);
    expect(Object.keys(await fieldsOf(dup))).toEqual(['sku']);

    const detail = (await (await member.get(`/api/parts/${made.id}`)).json()) as {
      onHand: number;
      units: { state: string; locationId: string }[];
      part: { keySpec: string };
    };
    expect(detail.onHand).toBe(3);
    expect(detail.part.keySpec).toBe('350 mA · 6–36 V in');
    expect(detail.units.every((u) => u.state === 'on_shelf' && u.locationId === bin.id)).toBe(true);
  });

  test('editing re-checks specs against a changed category, and tracking cannot change once stocked', async () => {
    const part = await makePart(db, spaceId, { category: 'consumable' });
    await makeStock(db, spaceId, part.id, (await makeLocation(db, spaceId)).id, 4);
    const toLed = await steward.post(
      `/api/parts/${part.id}`,
      { category: 'led', specs: { vfMin: 3 } },
      'PATCH',
    );
    expect(toLed.status).toBe(400);
    expect(Object.keys(await fieldsOf(toLed))).toEqual(
      expect.arrayContaining(['specs.vfTyp', 'specs.vfMax', 'specs.maxAmps', 'specs.maxWatts']),
    );
    const tracking = await steward.post(`/api/parts/${part.id}`, { tracking: 'unit' }, 'PATCH');
    expect(tracking.status).toBe(409);
    expect(Object.keys(await fieldsOf(tracking))).toEqual(['tracking']);
    const ok = await steward.post(`/api/parts/${part.id}`, { name: 'Renamed', reorderPoint: 10 }, 'PATCH');
    expect(ok.status).toBe(200);
    const row = await db
      .selectFrom('parts')
      .select(['name', 'reorder_point'])
      .where('id', '=', part.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ name: 'Renamed', reorder_point: 10 });
  });

  test('the table pages, sorts and filters on the server, and ?below=1 lists parts under their reorder point', async () => {
    const bin = await makeLocation(db, spaceId);
    const low = await makePart(db, spaceId, { name: 'Zz low stock', reorderPoint: 10 });
    const fine = await makePart(db, spaceId, { name: 'Zz fine stock', reorderPoint: 2 });
    await makeStock(db, spaceId, low.id, bin.id, 3);
    await makeStock(db, spaceId, fine.id, bin.id, 8);
    const below = (await (await member.get('/api/parts?below=1&q=zz')).json()) as {
      total: number;
      rows: { id: string; below: boolean; onHand: number }[];
    };
    expect(below.rows.map((r) => r.id)).toEqual([low.id]);
    expect(below.rows[0]).toMatchObject({ below: true, onHand: 3 });
    const sorted = (await (
      await member.get('/api/parts?q=zz&sort=onHand&dir=desc&pageSize=1&page=1')
    ).json()) as { total: number; rows: { id: string }[] };
    expect(sorted.total).toBe(2);
    expect(sorted.rows.map((r) => r.id)).toEqual([fine.id]);
    const bad = await member.get('/api/parts?sort=nope&pageSize=9999');
    expect(bad.status).toBe(400);
    expect(Object.keys(await fieldsOf(bad)).sort()).toEqual(['pageSize', 'sort']);
  });
});

describe('labels and codes', () => {
  test("a part's unit labels come back as a PDF with one label per unit", async () => {
    const made = (await (
      await steward.post('/api/parts', {
        sku: uniq('PSU'),
        name: 'Test 24 V supply',
        category: 'supply',
        tracking: 'unit',
        specs: { volts: 24, maxAmps: 2 },
        units: 5,
      })
    ).json()) as { id: string };
    const res = await steward.post('/api/labels', {
      selection: { kind: 'part', partId: made.id },
      layoutId: 'roll-50x25',
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('x-label-count')).toBe('5');
    const doc = await PDFDocument.load(new Uint8Array(await res.arrayBuffer()));
    // The roll layout holds one label per page.
    expect(doc.getPageCount()).toBe(5);
  });

  test('a large run can stream progress lines before the PDF', async () => {
    const res = await steward.fetch('/api/labels', {
      method: 'POST',
      headers: { 'content-type': 'application/json', accept: 'application/x-ndjson' },
      body: JSON.stringify({ selection: { kind: 'today' }, layoutId: 'a4-24' }),
    });
    expect(res.headers.get('content-type')).toMatch(/^application\/x-ndjson/);
    const lines = (await res.text())
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l) as { done?: number; total?: number; pdf?: string });
    const total = lines[0].total!;
    expect(total).toBeGreaterThan(5);
    expect(lines.at(-2)).toMatchObject({ done: total, total });
    const pdf = Buffer.from(lines.at(-1)!.pdf!, 'base64');
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect((await PDFDocument.load(pdf)).getPageCount()).toBe(Math.ceil(total / 24));
  });

  test('an unknown layout or an empty selection is a 400 naming the field', async () => {
    const part = await makePart(db, spaceId);
    const bad = await steward.post('/api/labels', {
      selection: { kind: 'part', partId: part.id },
      layoutId: 'nope',
    });
    expect(bad.status).toBe(400);
    expect(Object.keys(await fieldsOf(bad))).toEqual(['layoutId']);
    const empty = await steward.post('/api/labels', { selection: { kind: 'codes', codes: [] } });
    expect(empty.status).toBe(400);
    expect(Object.keys(await fieldsOf(empty))).toEqual(['selection.codes']);
  });

  test('a code resolves, in any of the ways people and scanners write it, to its page', async () => {
    const made = (await (
      await steward.post('/api/parts', {
        sku: uniq('M'),
        name: 'Test meter',
        category: 'meter',
        tracking: 'unit',
        units: 1,
      })
    ).json()) as {
      id: string;
      units: { code: string }[];
    };
    const code = made.units[0].code;
    const messy = `${code.slice(0, 4).toLowerCase()}-${code.slice(4)}`;
    for (const written of [code, messy, encodeURIComponent(`http://any.example/s/${code}`)]) {
      const res = await member.get(`/api/scan/${written}`);
      expect(res.status, written).toBe(200);
      expect(await res.json()).toMatchObject({
        code,
        kind: 'unit',
        href: `/shelf/parts/${made.id}?unit=${code}#unit-${code}`,
      });
    }
    // One wrong character: the check symbol catches it (Crockford Base32 mod-37 check).
    const wrong = (code[0] === '0' ? '1' : '0') + code.slice(1);
    const typo = await member.get(`/api/scan/${wrong}`);
    expect(typo.status).toBe(400);
    expect(Object.keys(await fieldsOf(typo))).toEqual(['code']);
  });

  test('the page route /s/<code> redirects to the thing, and a code that does not add up to the scan page', async () => {
    const bin = await makeLocation(db, spaceId);
    const res = await member.get(`/s/${bin.code}`);
    expect([307, 308]).toContain(res.status);
    expect(res.headers.get('location')).toMatch(new RegExp(`/shelf/locations/${bin.id}$`));
    const bad = await member.get('/s/ZZZZZZZ');
    expect([307, 308]).toContain(bad.status);
    expect(bad.headers.get('location')).toMatch(/\/scan\?code=ZZZZZZZ$/);
  });
});

describe('units, bins and counts', () => {
  test('a unit goes to repair and back with reasons; retired it cannot come back', async () => {
    const made = (await (
      await steward.post('/api/parts', {
        sku: uniq('D'),
        name: 'Repairable driver',
        category: 'driver',
        tracking: 'unit',
        specs: BUCK,
        units: 1,
      })
    ).json()) as {
      units: { id: string }[];
    };
    const id = made.units[0].id;
    const patch = (body: unknown) => steward.post(`/api/stock/units/${id}`, body, 'PATCH');
    expect((await patch({ state: 'in_repair', reason: 'flickers above 20 V' })).status).toBe(200);
    const repairs = (await (await member.get('/api/stock/repairs')).json()) as {
      units: { id: string; notes: string }[];
    };
    expect(repairs.units.find((u) => u.id === id)?.notes).toBe('flickers above 20 V');
    expect((await patch({ state: 'on_shelf', reason: 'resoldered the sense resistor' })).status).toBe(200);
    expect((await patch({ state: 'retired', reason: 'burnt' })).status).toBe(200);
    const back = await patch({ state: 'on_shelf', reason: 'try again' });
    expect(back.status).toBe(409);
    expect(Object.keys(await fieldsOf(back))).toEqual(['state']);
    expect(Object.keys(await fieldsOf(await patch({ state: 'in_repair', reason: '' })))).toEqual(['reason']);
    const moves = await db
      .selectFrom('stock_movements')
      .select(['reason', 'qty_delta'])
      .where('unit_id', '=', id)
      .orderBy('id')
      .execute();
    expect(moves.map((m) => m.reason)).toEqual(['receive', 'repair', 'repair', 'retire']);
  });

  test('a labelled unit moves to another bin on its own, with move movements; not into the bin it is in', async () => {
    const a = await makeLocation(db, spaceId);
    const b = await makeLocation(db, spaceId);
    const made = (await (
      await steward.post('/api/parts', {
        sku: uniq('M'),
        name: 'Movable meter',
        category: 'meter',
        tracking: 'unit',
        units: 1,
        locationId: a.id,
      })
    ).json()) as { units: { id: string }[] };
    const unitId = made.units[0].id;
    const res = await steward.post('/api/stock/move', { unitId, toLocationId: b.id });
    expect(res.status).toBe(200);
    const unit = await db
      .selectFrom('units')
      .select(['location_id', 'state'])
      .where('id', '=', unitId)
      .executeTakeFirstOrThrow();
    expect(unit).toEqual({ location_id: b.id, state: 'on_shelf' });
    const moves = await db
      .selectFrom('stock_movements')
      .select(['reason', 'location_id'])
      .where('unit_id', '=', unitId)
      .where('reason', 'in', ['move_out', 'move_in'])
      .orderBy('id')
      .execute();
    expect(moves).toEqual([
      { reason: 'move_out', location_id: a.id },
      { reason: 'move_in', location_id: b.id },
    ]);
    const again = await steward.post('/api/stock/move', { unitId, toLocationId: b.id });
    expect(again.status).toBe(400);
    expect(Object.keys(await fieldsOf(again))).toEqual(['toLocationId']);
    const missing = await steward.post('/api/stock/move', { unitId });
    expect(missing.status).toBe(400);
    expect(Object.keys(await fieldsOf(missing))).toEqual(['toLocationId']);
  });

  test('a bin is created with a code, and only an empty bin can be removed', async () => {
    const name = uniq('Bin');
    const res = await steward.post('/api/locations', { name, kind: 'drawer' });
    expect(res.status).toBe(201);
    const bin = (await res.json()) as { id: string; code: string };
    expect(verifyCode(bin.code).ok).toBe(true);
    expect((await steward.post('/api/locations', { name })).status).toBe(409);
    const part = await makePart(db, spaceId);
    await makeStock(db, spaceId, part.id, bin.id, 1);
    const busy = await steward.fetch(`/api/locations/${bin.id}`, { method: 'DELETE' });
    expect(busy.status).toBe(409);
    await db.updateTable('stock').set({ qty: 0 }).where('location_id', '=', bin.id).execute();
    expect((await steward.fetch(`/api/locations/${bin.id}`, { method: 'DELETE' })).status).toBe(200);
  });

  test('a count: open, enter, review the variance, post → stock matches with count movements', async () => {
    const bin = await makeLocation(db, spaceId);
    const a = await makePart(db, spaceId, { name: 'Counted A' });
    const b = await makePart(db, spaceId, { name: 'Counted B' });
    const found = await makePart(db, spaceId, { name: 'Found in bin' });
    await makeStock(db, spaceId, a.id, bin.id, 10);
    await makeStock(db, spaceId, b.id, bin.id, 5);
    const opened = (await (await steward.post('/api/stock/counts', { locationId: bin.id })).json()) as {
      id: string;
      created: boolean;
    };
    expect(opened.created).toBe(true);
    // Opening again carries on with the same count.
    expect(
      ((await (await steward.post('/api/stock/counts', { locationId: bin.id })).json()) as { id: string }).id,
    ).toBe(opened.id);

    const entered = await steward.post(
      `/api/stock/counts/${opened.id}`,
      {
        lines: [
          { partId: a.id, counted: 8 },
          { partId: b.id, counted: 5 },
          { partId: found.id, counted: 2 },
        ],
      },
      'PATCH',
    );
    expect(entered.status).toBe(200);
    const review = (await entered.json()) as { lines: { partId: string; variance: number | null }[] };
    expect(Object.fromEntries(review.lines.map((l) => [l.partId, l.variance]))).toEqual({
      [a.id]: -2,
      [b.id]: 0,
      [found.id]: 2,
    });

    const posted = await steward.post(`/api/stock/counts/${opened.id}/post`);
    expect(posted.status).toBe(200);
    expect(await posted.json()).toMatchObject({ changed: 2 });
    const stock = await db
      .selectFrom('stock')
      .select(['part_id', 'qty'])
      .where('location_id', '=', bin.id)
      .execute();
    expect(Object.fromEntries(stock.map((s) => [s.part_id, s.qty]))).toEqual({
      [a.id]: 8,
      [b.id]: 5,
      [found.id]: 2,
    });
    const moves = await db
      .selectFrom('stock_movements')
      .select(['part_id', 'qty_delta'])
      .where('ref_id', '=', opened.id)
      .where('reason', '=', 'count')
      .execute();
    expect(moves.sort((x, y) => x.qty_delta - y.qty_delta)).toEqual([
      { part_id: a.id, qty_delta: -2 },
      { part_id: found.id, qty_delta: 2 },
    ]);
    expect((await steward.post(`/api/stock/counts/${opened.id}/post`)).status).toBe(409);
  });
});
