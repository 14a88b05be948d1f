import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { createDb, type Db } from '@/db/connect';
import { closeTestDb, testDb } from '../helpers/db';

// Migrations up and down on a fresh database of the same PostgreSQL server, so the shared test
// database with its demo data is never touched. db/migrate.ts runs in a child process under tsx,
// exactly as `npm run db:migrate` runs it: Kysely's FileMigrationProvider loads the .ts migration
// files with Node's own import(), which vitest's transform does not reach.

const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);

// The tables of the first migration (db/types.ts Database, plus the rate limiter's own table).
// Later migrations may add more; these must always be there after up and gone after down.
const FOUNDATION_TABLES = [
  'spaces',
  'users',
  'memberships',
  'invitations',
  'sign_in_tokens',
  'label_codes',
  'locations',
  'parts',
  'stock',
  'units',
  'kit_templates',
  'kit_template_lines',
  'kit_boxes',
  'kit_box_contents',
  'loans',
  'loan_lines',
  'holds',
  'reminders',
  'sales',
  'sale_lines',
  'refunds',
  'payment_events',
  'closed_periods',
  'stock_movements',
  'stock_counts',
  'attachments',
  'audit_log',
  'rate_limits',
];

const dbName = `ohm_migrate_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`;
let url: string;
let fresh: Db;

/** Calls migrateToLatest or migrateDownAll of db/migrate.ts on the fresh database; returns its lines. */
async function migrate(fn: 'migrateToLatest' | 'migrateDownAll'): Promise<string[]> {
  const script = `
    const { createDb } = require('./db/connect');
    const m = require('./db/migrate');
    const db = createDb(process.env.OHM_MIGRATE_URL, 1);
    m[process.argv[1]](db)
      .then((lines) => console.log(JSON.stringify(lines)))
      .catch((err) => { console.error(err); process.exitCode = 1; })
      .finally(() => db.destroy());`;
  const { stdout } = await run(
    process.execPath,
    [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), '-e', script, fn],
    {
      cwd: ROOT,
      env: { ...process.env, OHM_MIGRATE_URL: url },
      timeout: 60_000,
    },
  );
  return JSON.parse(stdout.trim().split('\n').pop()!) as string[];
}

async function ourTables(): Promise<string[]> {
  const rows = await sql<{ table_name: string }>`
    select table_name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE' and table_name not like 'kysely_%'
    order by table_name`.execute(fresh);
  return rows.rows.map((r) => r.table_name);
}

beforeAll(async () => {
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  url = u.toString();
  fresh = createDb(url, 1);
});

afterAll(async () => {
  await fresh?.destroy();
  await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
});

describe('migrations on a fresh database', () => {
  test('the fresh database starts without tables', async () => {
    expect(await ourTables()).toEqual([]);
  });

  test('up applies every migration and creates every table', async () => {
    const done = await migrate('migrateToLatest');
    expect(done[0]).toBe('0001_initial: Success');
    expect(done.every((line) => line.endsWith(': Success'))).toBe(true);
    expect(await ourTables()).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
  });

  test('the migrated schema enforces its own rules', async () => {
    const space = await fresh
      .insertInto('spaces')
      .values({ slug: 'm', name: 'M' })
      .returning('id')
      .executeTakeFirstOrThrow();
    const user = await fresh
      .insertInto('users')
      .values({ email: 'a@m.example', name: 'A' })
      .returning('id')
      .executeTakeFirstOrThrow();
    // A role outside the four is refused by the check constraint, not only by the app.
    await expect(
      fresh
        .insertInto('memberships')
        .values({ space_id: space.id, user_id: user.id, roles: ['owner' as never] })
        .execute(),
    ).rejects.toThrow(/check constraint/);
    // E-mail is case-insensitive (citext): the same address in other capitals is a duplicate.
    await expect(
      fresh.insertInto('users').values({ email: 'A@M.example', name: 'B' }).execute(),
    ).rejects.toThrow(/unique/);
  });

  test('running up again has nothing to do', async () => {
    expect(await migrate('migrateToLatest')).toEqual([]);
  });

  test('down all reverts every migration and removes every table', async () => {
    const done = await migrate('migrateDownAll');
    expect(done.at(-1)).toBe('0001_initial: Success');
    expect(await ourTables()).toEqual([]);
    const applied = await sql<{ n: number }>`select count(*)::int as n from kysely_migration`.execute(fresh);
    expect(applied.rows[0].n).toBe(0);
  });

  test('up works again after down (the down steps leave nothing in the way)', async () => {
    await migrate('migrateToLatest');
    expect(await ourTables()).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
  });
});
