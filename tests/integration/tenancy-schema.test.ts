import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import { NULLABLE_SPACE_ID, SPACE_TABLES } from '@/db/space-tables';
import { closeTestDb, makeCode, makeLocation, makePart, makeSpace, makeUnit, makeUser, testDb } from '../helpers/db';

// Tenancy held by the database itself (migration 0005_space_keys): every table a space owns has
// space_id, and every reference between two space-owned tables is a composite (space_id, x_id) key, so a
// row cannot point at another space's row whatever the code above does. This file reads the catalog,
// so a future table that breaks the rule fails here.

const db = testDb();

type Fk = { child: string; name: string; childCols: string[]; parent: string; parentCols: string[] };

async function foreignKeys(): Promise<Fk[]> {
  const rows = await sql<{ child: string; name: string; child_cols: string[]; parent: string; parent_cols: string[] }>`
    select c.conrelid::regclass::text as child, c.conname as name, c.confrelid::regclass::text as parent,
           array(select a.attname::text from unnest(c.conkey) with ordinality k(n, i)
                 join pg_attribute a on a.attrelid = c.conrelid and a.attnum = k.n order by k.i) as child_cols,
           array(select a.attname::text from unnest(c.confkey) with ordinality k(n, i)
                 join pg_attribute a on a.attrelid = c.confrelid and a.attnum = k.n order by k.i) as parent_cols
    from pg_constraint c
    where c.contype = 'f' and c.connamespace = 'public'::regnamespace
    order by 1, 2`.execute(db);
  return rows.rows.map((r) => ({ child: r.child, name: r.name, childCols: r.child_cols, parent: r.parent, parentCols: r.parent_cols }));
}

async function tablesWithSpaceId(): Promise<{ table: string; nullable: boolean }[]> {
  const rows = await sql<{ table_name: string; is_nullable: string }>`
    select c.table_name, c.is_nullable from information_schema.columns c
    join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name
    where c.table_schema = 'public' and c.column_name = 'space_id' and t.table_type = 'BASE TABLE'
    order by 1`.execute(db);
  return rows.rows.map((r) => ({ table: r.table_name, nullable: r.is_nullable === 'YES' }));
}

let spaceA: string;
let spaceB: string;

beforeAll(async () => {
  spaceA = (await makeSpace(db, { name: 'Tenancy schema A' })).id;
  spaceB = (await makeSpace(db, { name: 'Tenancy schema B' })).id;
});

afterAll(async () => {
  await closeTestDb();
});

describe('the catalog: space_id everywhere a space owns rows, composite keys between them', () => {
  test('the tables with space_id are exactly db/space-tables.ts (the list scoped() and the scan use)', async () => {
    const found = await tablesWithSpaceId();
    expect(found.map((t) => t.table).sort()).toEqual([...SPACE_TABLES].sort());
  });

  test('space_id is NOT NULL on every space-owned table but the two documented ones', async () => {
    const nullable = (await tablesWithSpaceId()).filter((t) => t.nullable).map((t) => t.table);
    expect(nullable.sort()).toEqual([...NULLABLE_SPACE_ID].sort());
  });

  test('the two child tables that lacked it carry it now: kit box contents and kit template lines', async () => {
    const found = (await tablesWithSpaceId()).map((t) => t.table);
    expect(found).toEqual(expect.arrayContaining(['kit_box_contents', 'kit_template_lines', 'loan_lines', 'sale_lines']));
  });

  test('every foreign key from a space-owned table to another is composite: (space_id, x) → (space_id, y)', async () => {
    const owned = new Set<string>(SPACE_TABLES);
    const between = (await foreignKeys()).filter((fk) => owned.has(fk.child) && owned.has(fk.parent));
    // The rule must have something to check: 0001 had 35 such keys.
    expect(between.length).toBeGreaterThanOrEqual(35);
    const single = between
      .filter((fk) => fk.childCols[0] !== 'space_id' || fk.parentCols[0] !== 'space_id' || fk.childCols.length < 2)
      .map((fk) => `${fk.child}.${fk.name} (${fk.childCols.join(', ')}) → ${fk.parent} (${fk.parentCols.join(', ')})`);
    expect(single).toEqual([]);
  });

  test('every parent of such a key has its (space_id, id) unique index under the shared name', async () => {
    const owned = new Set<string>(SPACE_TABLES);
    const parents = new Set(
      (await foreignKeys()).filter((fk) => owned.has(fk.child) && owned.has(fk.parent)).map((fk) => `${fk.parent}:${fk.parentCols[1]}`),
    );
    const idx = await sql<{ indexname: string }>`select indexname from pg_indexes where schemaname = 'public'`.execute(db);
    const names = new Set(idx.rows.map((r) => r.indexname));
    // memberships is keyed (space_id, user_id) by its own primary key, which serves the same purpose.
    const missing = [...parents]
      .map((p) => p.split(':'))
      .filter(([t, col]) => !names.has(`${t}_space_id_${col}_uq`) && !(t === 'memberships' && col === 'user_id' && names.has('memberships_pk')));
    expect(missing).toEqual([]);
  });
});

describe('the database refuses a row pointing at another space’s row', () => {
  test('a stock row of space A for a part of space B fails at the database', async () => {
    const partB = await makePart(db, spaceB);
    const binA = await makeLocation(db, spaceA);
    await expect(
      db.insertInto('stock').values({ space_id: spaceA, part_id: partB.id, location_id: binA.id, qty: 1 }).execute(),
    ).rejects.toThrow(/foreign key constraint "stock_part_id_fkey"/);
  });

  test('a kit box content of space A naming a unit of space B fails; the same in one space is accepted', async () => {
    const partA = await makePart(db, spaceA, { tracking: 'unit' });
    const partB = await makePart(db, spaceB, { tracking: 'unit' });
    const unitB = await makeUnit(db, spaceB, partB.id);
    const unitA = await makeUnit(db, spaceA, partA.id);
    const tpl = await db
      .insertInto('kit_templates')
      .values({ space_id: spaceA, name: `Tenancy ${randomUUID()}` })
      .returning('id')
      .executeTakeFirstOrThrow();
    const boxId = randomUUID();
    const code = await makeCode(db, spaceA, 'kit_box', boxId);
    await db.insertInto('kit_boxes').values({ id: boxId, space_id: spaceA, template_id: tpl.id, code, name: 'Box' }).execute();
    await expect(
      db.insertInto('kit_box_contents').values({ space_id: spaceA, kit_box_id: boxId, part_id: partA.id, unit_id: unitB.id }).execute(),
    ).rejects.toThrow(/kit_box_contents_unit_id_fkey/);
    // Claiming the other space for the row does not help either: the box is A's.
    await expect(
      db.insertInto('kit_box_contents').values({ space_id: spaceB, kit_box_id: boxId, part_id: partB.id, unit_id: unitB.id }).execute(),
    ).rejects.toThrow(/kit_box_contents_kit_box_id_fkey/);
    await db.insertInto('kit_box_contents').values({ space_id: spaceA, kit_box_id: boxId, part_id: partA.id, unit_id: unitA.id }).execute();
  });

  test('a loan line of space A for space B’s loan fails; moving a unit into another space’s bin fails', async () => {
    const borrower = await makeUser(db, spaceB, ['member']);
    const loanB = await db
      .insertInto('loans')
      .values({ space_id: spaceB, borrower_id: borrower.id, due_at: new Date(Date.now() + 86_400_000) })
      .returning('id')
      .executeTakeFirstOrThrow();
    const partA = await makePart(db, spaceA);
    await expect(
      db.insertInto('loan_lines').values({ space_id: spaceA, loan_id: loanB.id, part_id: partA.id, qty: 1 }).execute(),
    ).rejects.toThrow(/loan_lines_loan_id_fkey/);

    const unitA = await makeUnit(db, spaceA, (await makePart(db, spaceA, { tracking: 'unit' })).id);
    const binB = await makeLocation(db, spaceB);
    await expect(db.updateTable('units').set({ location_id: binB.id }).where('id', '=', unitA.id).execute()).rejects.toThrow(
      /units_location_id_fkey/,
    );
  });

  test('deleting a bin still sets its units’ location to null (set null names the id column only)', async () => {
    const bin = await makeLocation(db, spaceA);
    const unit = await makeUnit(db, spaceA, (await makePart(db, spaceA, { tracking: 'unit' })).id, bin.id);
    await db.deleteFrom('locations').where('id', '=', bin.id).execute();
    const after = await db.selectFrom('units').select(['space_id', 'location_id']).where('id', '=', unit.id).executeTakeFirstOrThrow();
    expect(after).toEqual({ space_id: spaceA, location_id: null });
  });
});
