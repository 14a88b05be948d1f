import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http';
import { closeTestDb, makePart, testDb } from '../helpers/db';
import { errorOf, session, staffedSpace } from './auth-fixtures';

// Supplier offers as CSV beside the parts CSV (issue 13), through real HTTP on real PostgreSQL: the export
// reads back in; the import checks every row and answers by row and field; a commit is one transaction
// with its audit row (one bad row: nothing written); members and treasurers see none of it.

const db = testDb();
let space: Awaited<ReturnType<typeof staffedSpace>>;
let steward: HttpSession;
const ids = {} as Record<'pad' | 'lead' | 'wren' | 'quay', string>;
const HEADER = 'supplier,sku,their_ref,pack_size,pack_price,preferred';
const offers = () =>
  db
    .selectFrom('supplier_offers')
    .innerJoin('suppliers', 'suppliers.id', 'supplier_offers.supplier_id')
    .innerJoin('parts', 'parts.id', 'supplier_offers.part_id')
    .select(['suppliers.name', 'parts.sku', 'supplier_offers.item_ref', 'supplier_offers.pack_size', 'supplier_offers.pack_price_minor', 'supplier_offers.preferred'])
    .where('supplier_offers.space_id', '=', space.space.id)
    .orderBy('suppliers.name')
    .orderBy('parts.sku')
    .execute();

beforeAll(async () => {
  space = await staffedSpace(db, 'Offers CSV space');
  const s = space.space.id;
  const pad = await makePart(db, s, { name: 'Star pads' });
  const lead = await makePart(db, s, { name: 'Twin lead', category: 'wire' });
  await db.updateTable('parts').set({ sku: 'PAD-20' }).where('id', '=', pad.id).execute();
  await db.updateTable('parts').set({ sku: 'LEAD-22' }).where('id', '=', lead.id).execute();
  ids.pad = pad.id;
  ids.lead = lead.id;
  ids.wren = (await db.insertInto('suppliers').values({ space_id: s, name: 'Wrenfold Trading' }).returning('id').executeTakeFirstOrThrow()).id;
  ids.quay = (await db.insertInto('suppliers').values({ space_id: s, name: 'Quayfold Parts' }).returning('id').executeTakeFirstOrThrow()).id;
  // Today: lead from Quayfold, preferred, 25 m for 10.00.
  await db
    .insertInto('supplier_offers')
    .values({ space_id: s, supplier_id: ids.quay, part_id: ids.lead, item_ref: 'QF-7', pack_size: 25, pack_price_minor: 1000, preferred: true })
    .execute();
  steward = await session(space.people.steward);
});

afterAll(closeTestDb);

describe('importing offers', () => {
  it('a preview names each bad row’s field and writes nothing', async () => {
    const csv = [HEADER, 'Wrenfold Trading,PAD-20,WF-1,10,4.05,yes', 'Wrenfold Trading,LEAD-22,WF-2,0,9.50,yes'].join('\r\n');
    const res = await steward.post('/api/suppliers/offers/import', { csv });
    expect(res.status).toBe(200);
    const check = (await res.json()) as { rows: unknown[]; errors: { row: number; field: string }[] };
    expect(check.rows).toHaveLength(1);
    expect(check.errors.map((e) => [e.row, e.field])).toEqual([[3, 'pack_size']]);
    expect(await offers()).toHaveLength(1);
  });

  it('one bad row refuses the whole file: 400 naming rows.<row>.<field>, nothing written', async () => {
    const csv = [HEADER, 'Wrenfold Trading,PAD-20,WF-1,10,4.05,yes', 'Wrenfold Trading,LEAD-22,WF-2,25,nine,no'].join('\r\n');
    const res = await steward.post('/api/suppliers/offers/import?commit=1', { csv });
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields).toHaveProperty(['rows.3.pack_price']);
    expect(await offers()).toEqual([{ name: 'Quayfold Parts', sku: 'LEAD-22', item_ref: 'QF-7', pack_size: 25, pack_price_minor: 1000, preferred: true }]);
  });

  it('commits all rows in one go: adds, replaces, and a preferred row unmarks the part’s other offer', async () => {
    const csv = [
      HEADER,
      'Wrenfold Trading,PAD-20,WF-1,10,4.05,yes',
      'Wrenfold Trading,LEAD-22,WF-2,25,9.50,yes',
      'Quayfold Parts,LEAD-22,QF-7,25,10.40,no',
    ].join('\r\n');
    const res = await steward.post('/api/suppliers/offers/import?commit=1', { csv });
    expect(res.status).toBe(201);
    expect(await res.json()).toEqual({ added: 2, replaced: 1, rows: 3 });
    expect(await offers()).toEqual([
      { name: 'Quayfold Parts', sku: 'LEAD-22', item_ref: 'QF-7', pack_size: 25, pack_price_minor: 1040, preferred: false },
      { name: 'Wrenfold Trading', sku: 'LEAD-22', item_ref: 'WF-2', pack_size: 25, pack_price_minor: 950, preferred: true },
      { name: 'Wrenfold Trading', sku: 'PAD-20', item_ref: 'WF-1', pack_size: 10, pack_price_minor: 405, preferred: true },
    ]);
    const audit = await db
      .selectFrom('audit_log')
      .select('detail')
      .where('space_id', '=', space.space.id)
      .where('action', '=', 'supplier.offers_imported')
      .execute();
    expect(audit.map((a) => a.detail)).toEqual([{ added: 2, replaced: 1, rows: 3 }]);
  });

  it('another space’s supplier is not known here', async () => {
    const other = await staffedSpace(db, 'Other offers space');
    await db.insertInto('suppliers').values({ space_id: other.space.id, name: 'Elsewhere Supply' }).execute();
    const res = await steward.post('/api/suppliers/offers/import', { csv: [HEADER, 'Elsewhere Supply,PAD-20,,10,1.00,no'].join('\r\n') });
    const check = (await res.json()) as { errors: { row: number; field: string }[] };
    expect(check.errors.map((e) => [e.row, e.field])).toEqual([[2, 'supplier']]);
  });
});

describe('exporting offers', () => {
  it('writes every offer in the parts CSV’s conventions, and the file imports back unchanged', async () => {
    const res = await steward.get('/api/suppliers/offers/export');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    const text = await res.text();
    const rows = Papa.parse<Record<string, string>>(text.replace(/^\ufeff/, ''), { header: true, skipEmptyLines: true }).data;
    expect(rows.map((r) => [r.supplier, r.sku, r.part, r.pack_price, r.preferred])).toEqual([
      ['Quayfold Parts', 'LEAD-22', 'Twin lead', '10.40', 'no'],
      ['Wrenfold Trading', 'LEAD-22', 'Twin lead', '9.50', 'yes'],
      ['Wrenfold Trading', 'PAD-20', 'Star pads', '4.05', 'yes'],
    ]);
    const before = await offers();
    const back = await steward.post('/api/suppliers/offers/import?commit=1', { csv: text });
    expect(back.status).toBe(201);
    expect(await back.json()).toEqual({ added: 0, replaced: 3, rows: 3 });
    expect(await offers()).toEqual(before);
  });

  it('members and treasurers never see suppliers or prices', async () => {
    for (const who of [space.people.member, space.people.treasurer]) {
      const s = await session(who);
      expect((await s.get('/api/suppliers/offers/export')).status).toBe(403);
      expect((await s.post('/api/suppliers/offers/import', { csv: HEADER })).status).toBe(403);
    }
  });
});
