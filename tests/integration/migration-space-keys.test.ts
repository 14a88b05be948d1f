import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { createDb, type Db } from '@/db/connect';
import { closeTestDb, testDb } from '../helpers/db';

// Migration 0005_space_keys on the demo data, without loss: a fresh database is migrated to 0004, filled
// with the seeded demo of this test run (the seed writes today's schema, so its rows are copied over
// without the columns 0005 adds), counted and checksummed table by table (md5 of the ordered rows),
// taken through 0005, and compared; then down again and compared once more.

const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);
const BEFORE = '0004_sessions_and_space_access';
const MIGRATION = '0005_space_keys';

const dbName = `ohm_keys_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`;
let fresh: Db;
let url: string;

async function migrateTo(name: string): Promise<string[]> {
  const script = `
    const { createDb } = require('./db/connect');
    const m = require('./db/migrate');
    const db = createDb(process.env.OHM_MIGRATE_URL, 1);
    m.migrateTo(db, process.argv[1])
      .then((lines) => console.log(JSON.stringify(lines)))
      .catch((err) => { console.error(err); process.exitCode = 1; })
      .finally(() => db.destroy());`;
  const { stdout } = await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), '-e', script, name], {
    cwd: ROOT,
    env: { ...process.env, OHM_MIGRATE_URL: url },
    timeout: 120_000,
  });
  return JSON.parse(stdout.trim().split('\n').pop()!) as string[];
}

/** Our tables and their columns, as the database has them now. */
async function columns(db: Db): Promise<Map<string, string[]>> {
  const rows = await sql<{ table_name: string; column_name: string }>`
    select c.table_name, c.column_name from information_schema.columns c
    join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name
    where c.table_schema = 'public' and t.table_type = 'BASE TABLE' and c.table_name not like 'kysely_%'
    order by c.table_name, c.ordinal_position`.execute(db);
  const out = new Map<string, string[]>();
  for (const r of rows.rows) out.set(r.table_name, [...(out.get(r.table_name) ?? []), r.column_name]);
  return out;
}

type Sums = Record<string, { rows: number; md5: string }>;

/** Row count and md5 of the ordered rows of each table, over the given columns. */
async function checksums(db: Db, cols: Map<string, string[]>): Promise<Sums> {
  const out: Sums = {};
  for (const [table, list] of cols) {
    const r = await sql<{ n: number; md5: string }>`
      select count(*)::int as n, md5(coalesce(string_agg(r::text, E'\\n' order by r::text), '')) as md5
      from (select ${sql.join(list.map((c) => sql.id(c)))} from ${sql.table(table)}) r`.execute(db);
    out[table] = { rows: r.rows[0].n, md5: r.rows[0].md5 };
  }
  return out;
}

let at0004: Map<string, string[]>;
let before: Sums;

beforeAll(async () => {
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  url = u.toString();
  fresh = createDb(url, 1);
  const done = await migrateTo(BEFORE);
  expect(done.at(-1)).toBe(`${BEFORE}: Success`);
  at0004 = await columns(fresh);

  // The demo, copied row for row into the 0004 schema (json_populate_recordset drops the columns 0004
  // does not have). Foreign keys are not checked while copying; 0005 checks every row when it adds its keys.
  const source = testDb();
  const wholeNumberColumns = new Map<string, string[]>();
  const ints = await sql<{ table_name: string; column_name: string }>`
    select table_name, column_name from information_schema.columns
    where table_schema = 'public' and data_type in ('integer', 'smallint', 'bigint')`.execute(fresh);
  for (const r of ints.rows) wholeNumberColumns.set(r.table_name, [...(wholeNumberColumns.get(r.table_name) ?? []), r.column_name]);
  await fresh.transaction().execute(async (trx) => {
    await sql`set local session_replication_role = replica`.execute(trx);
    // Only the demo's rows: other test files leave rows that use later migrations' values (new loan states).
    const demo = sql`(select id from spaces where slug in ('quillmere', 'fernwick'))`;
    for (const [table, cols] of at0004) {
      const only =
        table === 'spaces'
          ? sql`where t.id in ${demo}`
          : table === 'kit_box_contents'
            ? sql`where t.kit_box_id in (select id from kit_boxes where space_id in ${demo})`
            : table === 'kit_template_lines'
              ? sql`where t.template_id in (select id from kit_templates where space_id in ${demo})`
              : cols.includes('space_id')
                ? sql`where t.space_id in ${demo}`
                : sql``;
      const data = await sql<{ rows: Record<string, unknown>[] }>`select coalesce(json_agg(t), '[]'::json) as rows from ${sql.table(table)} t ${only}`.execute(source);
      // Today's demo counts wire in metres and solder in grams, with fractions (0014); 0004's quantity
      // columns hold whole numbers, so those values copy rounded. What is tested is that 0005 keeps every
      // row as the copy has it, not the copy's fidelity to today's schema.
      const whole = wholeNumberColumns.get(table) ?? [];
      const rows = data.rows[0].rows.map((r) => {
        for (const c of whole) if (typeof r[c] === 'number' && !Number.isInteger(r[c])) r[c] = Math.round(r[c]);
        return r;
      });
      await sql`insert into ${sql.table(table)} select * from json_populate_recordset(null::${sql.table(table)}, ${JSON.stringify(rows)}::json)`.execute(trx);
    }
  });
  before = await checksums(fresh, at0004);
}, 240_000);

afterAll(async () => {
  await fresh?.destroy();
  await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
});

describe('0005_space_keys on the seeded demo', () => {
  test('the copy holds the demo: both demo spaces, their kits, loans and sales', async () => {
    const spaces = await fresh.selectFrom('spaces').select('slug').execute();
    expect(spaces.map((s) => s.slug)).toEqual(expect.arrayContaining(['quillmere', 'fernwick']));
    for (const t of ['kit_box_contents', 'kit_template_lines', 'loans', 'loan_lines', 'units', 'stock', 'sales', 'sale_lines'])
      expect(before[t].rows, t).toBeGreaterThan(0);
    // The two tables 0005 changes have no space_id yet.
    expect(at0004.get('kit_box_contents')).not.toContain('space_id');
    expect(at0004.get('kit_template_lines')).not.toContain('space_id');
  });

  test('up: every table keeps its rows, each row unchanged (count and md5 per table)', async () => {
    expect(await migrateTo(MIGRATION)).toEqual([`${MIGRATION}: Success`]);
    expect(await checksums(fresh, at0004)).toEqual(before);
  }, 120_000);

  test('up: the new space_id is the parent’s on every row, and never null', async () => {
    const wrong = await sql<{ n: number }>`
      select (select count(*) from kit_box_contents c join kit_boxes b on b.id = c.kit_box_id where c.space_id is distinct from b.space_id)
           + (select count(*) from kit_template_lines l join kit_templates t on t.id = l.template_id where l.space_id is distinct from t.space_id)
           as n`.execute(fresh);
    expect(Number(wrong.rows[0].n)).toBe(0);
    const cols = await columns(fresh);
    expect(cols.get('kit_box_contents')).toContain('space_id');
    expect(cols.get('kit_template_lines')).toContain('space_id');
  });

  test('down to 0004: the rows are still all there and unchanged', async () => {
    expect(await migrateTo(BEFORE)).toEqual([`${MIGRATION}: Success`]);
    expect(await columns(fresh)).toEqual(at0004);
    expect(await checksums(fresh, at0004)).toEqual(before);
  }, 120_000);
});
