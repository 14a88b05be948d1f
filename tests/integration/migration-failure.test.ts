import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '@/db/connect';
import { closeTestDb, makePart, makeSpace, makeUser, testDb } from '../helpers/db';

// An upgrade whose migration fails leaves the database exactly as it was. Kysely's Migrator runs every
// pending migration inside one transaction on PostgreSQL (transactional DDL), so a good migration followed
// by a broken one commits neither. Proved on a scratch database: the real migrations, data in it, then two
// more pending — one that adds a column and rewrites rows, one that creates a table and then fails — and
// every table's row count and checksum, the columns and the migration record compared before and after.
// Runs under tsx in a child process, as `npm run db:migrate` does (FileMigrationProvider uses Node's import).
const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);
const dbName = `ohm_migfail_${Date.now().toString(36)}_${randomBytes(3).toString('hex')}`;
let url: string;
let scratch: Db;

const UPGRADE = `
  const fs = require('node:fs/promises');
  const path = require('node:path');
  const { FileMigrationProvider, Migrator, sql } = require('kysely');
  const { createDb } = require('./db/connect');
  const db = createDb(process.env.OHM_SCRATCH_URL, 2);
  const files = new FileMigrationProvider({ fs, path, migrationFolder: path.resolve('db/migrations') });
  const provider = {
    async getMigrations() {
      return {
        ...(await files.getMigrations()),
        '9998_adds_a_column': { up: async (trx) => {
          await sql\`alter table parts add column upgrade_extra text\`.execute(trx);
          await sql\`update parts set notes = 'rewritten by the upgrade'\`.execute(trx);
        } },
        '9999_breaks': { up: async (trx) => {
          await sql\`create table upgrade_never_kept (id int)\`.execute(trx);
          await sql\`select 1 / 0\`.execute(trx);
        } },
      };
    },
  };
  new Migrator({ db, provider }).migrateToLatest()
    .then(({ error, results }) => console.log(JSON.stringify({ error: error ? String(error.message) : null, results })))
    .finally(() => db.destroy());`;

async function fingerprint(db: Db): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  const tables = await sql<{ t: string }>`select tablename as t from pg_tables where schemaname = 'public' order by 1`.execute(db);
  for (const { t } of tables.rows) {
    const r = await sql<{ n: number; md5: string }>`
      select count(*)::int as n, md5(coalesce(string_agg(x::text, E'\\n' order by x::text), '')) as md5 from ${sql.table(t)} x`.execute(db);
    out[`table ${t}`] = `${r.rows[0]!.n} ${r.rows[0]!.md5}`;
  }
  const cols = await sql<{ c: string }>`
    select string_agg(table_name || '.' || column_name || ':' || data_type, ',' order by table_name, column_name) as c
    from information_schema.columns where table_schema = 'public'`.execute(db);
  out.columns = cols.rows[0]!.c;
  return out;
}

beforeAll(async () => {
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  url = u.toString();
  await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), 'scripts/migrate.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url }, timeout: 120_000 });
  scratch = createDb(url, 2);
  const space = await makeSpace(scratch);
  await makeUser(scratch, space.id, ['admin']);
  for (let i = 0; i < 4; i++) await makePart(scratch, space.id, { name: `Part ${i}` });
}, 180_000);

afterAll(async () => {
  await scratch?.destroy();
  await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
});

describe('a failed migration', () => {
  it('leaves schema and data as they were, the good migration before it included', { timeout: 180_000 }, async () => {
    const before = await fingerprint(scratch);
    expect(Object.keys(before).length).toBeGreaterThan(25);
    const { stdout } = await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), '-e', UPGRADE], {
      cwd: ROOT,
      env: { ...process.env, OHM_SCRATCH_URL: url },
      timeout: 120_000,
    });
    const outcome = JSON.parse(stdout.trim().split('\n').pop()!) as { error: string | null; results: Array<{ migrationName: string; status: string }> };
    expect(outcome.error).toMatch(/division by zero/);
    expect(outcome.results.map((r) => r.migrationName)).toEqual(['9998_adds_a_column', '9999_breaks']);

    const after = await fingerprint(scratch);
    expect(after).toEqual(before);
    expect(after.columns).not.toContain('upgrade_extra');
    expect(Object.keys(after)).not.toContain('table upgrade_never_kept');
    const recorded = await sql<{ name: string }>`select name from kysely_migration order by name`.execute(scratch);
    expect(recorded.rows.map((r) => r.name)).not.toContain('9998_adds_a_column');
  });
});
