import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtemp, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { createDb, type Db } from '@/db/connect';
import { closeTestDb, testDb } from '../helpers/db';

// `npm run db:backup` / `npm run db:restore` end to end: the real scripts (pg_dump -Fc, pg_restore) on a
// scratch database of the test run's PostgreSQL server, migrated and filled with the demo data. The
// shared test database is never touched. Every table's row count and a checksum of its rows (md5 over
// each row's text, in primary-key order) must come back exactly, and so must every sequence.

const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);
const dbName = `ohm_backup_${Date.now().toString(36)}_${randomBytes(3).toString('hex')}`;
let url: string;
let scratch: Db | undefined;
let dir: string;
let dumpFile: string;
let original: Snapshot;

type Snapshot = { tables: Record<string, { rows: number; md5: string }>; sequences: Record<string, string> };

function connect(): Db {
  scratch = createDb(url, 2);
  return scratch;
}

async function disconnect(): Promise<void> {
  await scratch?.destroy();
  scratch = undefined;
}

/** Runs a script of scripts/ against the scratch database; never throws, so failures can be asserted. */
async function script(name: string, args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run('bash', [path.join(ROOT, 'scripts', name), ...args], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: url },
      timeout: 120_000,
    });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as { code?: number; stdout?: string; stderr?: string };
    return { code: typeof e.code === 'number' ? e.code : -1, stdout: e.stdout ?? '', stderr: e.stderr ?? '' };
  }
}

/** Migrates with db/migrate.ts and seeds with db/seed/demo.ts, under tsx as `npm run db:migrate` runs them. */
async function migrateAndSeed(): Promise<void> {
  const code = `
    const { createDb } = require('./db/connect');
    const { migrateToLatest } = require('./db/migrate');
    const { seedDemo } = require('./db/seed/demo');
    const db = createDb(process.env.OHM_SCRATCH_URL, 2);
    migrateToLatest(db)
      .then(() => seedDemo(db))
      .then((r) => { if (!r.seeded) throw new Error('the scratch database was not empty'); })
      .catch((err) => { console.error(err); process.exitCode = 1; })
      .finally(() => db.destroy());`;
  await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), '-e', code], {
    cwd: ROOT,
    env: { ...process.env, OHM_SCRATCH_URL: url },
    timeout: 120_000,
  });
}

/** Every table of the public schema: row count and md5 of its rows' text in primary-key order; every sequence. */
async function snapshot(db: Db): Promise<Snapshot> {
  const tables = await sql<{ name: string; pk: string[] | null }>`
    select c.relname as name,
      (select array_agg(a.attname::text order by k.ord)
         from pg_index i
         cross join unnest(i.indkey) with ordinality as k(attnum, ord)
         join pg_attribute a on a.attrelid = i.indrelid and a.attnum = k.attnum
        where i.indrelid = c.oid and i.indisprimary) as pk
    from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where n.nspname = 'public' and c.relkind in ('r', 'p')
    order by c.relname`.execute(db);
  const out: Snapshot = { tables: {}, sequences: {} };
  for (const t of tables.rows) {
    const order = t.pk?.length ? sql.join(t.pk.map((c) => sql.ref(`t.${c}`))) : sql`t::text`;
    const r = await sql<{ rows: number; md5: string }>`
      select count(*)::int as rows, md5(coalesce(string_agg(t::text, E'\\n' order by ${order}), '')) as md5
      from ${sql.table(t.name)} as t`.execute(db);
    out.tables[t.name] = r.rows[0];
  }
  const seqs = await sql<{ name: string; state: string }>`
    select sequencename as name, coalesce(last_value::text, 'unused') as state
    from pg_sequences where schemaname = 'public' order by sequencename`.execute(db);
  for (const s of seqs.rows) out.sequences[s.name] = s.state;
  return out;
}

async function recreateDatabase(): Promise<void> {
  await disconnect();
  await sql`drop database ${sql.id(dbName)} with (force)`.execute(testDb());
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
}

beforeAll(async () => {
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  url = u.toString();
  dir = await mkdtemp(path.join(tmpdir(), 'ohm-backup-'));
  dumpFile = path.join(dir, 'scratch.dump');
  await migrateAndSeed();
  // Bytes that are not text and text that is not ASCII must survive the round trip too.
  const db = connect();
  const part = await db.selectFrom('parts').select(['id', 'space_id']).orderBy('id').limit(1).executeTakeFirstOrThrow();
  await db
    .insertInto('attachments')
    .values({
      space_id: part.space_id,
      part_id: part.id,
      filename: 'Kennlinie – Ω·µ “test”.bin',
      mime: 'application/octet-stream',
      size_bytes: 256,
      sha256: 'x'.repeat(64),
      data: Buffer.from(Array.from({ length: 256 }, (_, i) => i)),
    })
    .execute();
  original = await snapshot(db);
}, 180_000);

afterAll(async () => {
  await disconnect();
  await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('backup → drop → restore', () => {
  test('the scratch database holds the demo data (so the comparison below is not vacuous)', () => {
    expect(Object.keys(original.tables).length).toBeGreaterThanOrEqual(28);
    for (const t of ['spaces', 'users', 'parts', 'stock', 'units', 'loans', 'loan_lines', 'audit_log', 'attachments', 'kysely_migration'])
      expect(original.tables[t]?.rows, t).toBeGreaterThan(0);
    expect(Object.keys(original.sequences).length).toBeGreaterThan(0);
  });

  test('db:backup writes a custom-format dump to the path given and names it', async () => {
    const r = await script('db-backup.sh', [dumpFile]);
    expect(r.stderr).toContain(`backing up ${dbName}`);
    expect(r.code).toBe(0);
    expect(r.stdout.trim().split('\n').pop()).toBe(dumpFile);
    const head = await readFile(dumpFile);
    expect(head.subarray(0, 5).toString('latin1')).toBe('PGDMP'); // pg_dump custom-format signature
    expect((await stat(dumpFile)).size).toBeGreaterThan(10_000);
  });

  test('after the database is dropped and created empty, db:restore brings back every row and sequence', async () => {
    await recreateDatabase();
    const empty = await snapshot(connect());
    expect(Object.keys(empty.tables)).toEqual([]);

    const r = await script('db-restore.sh', [dumpFile, '--yes']);
    expect(r.stderr).toContain(`into ${dbName} on `);
    expect(r.code).toBe(0);
    const restored = await snapshot(scratch!);
    expect(restored.tables).toEqual(original.tables);
    expect(restored.sequences).toEqual(original.sequences);
  });

  test('restoring over a changed database puts it back exactly as backed up', async () => {
    const db = scratch!;
    await db.updateTable('parts').set({ name: 'renamed after the backup' }).execute();
    await db.deleteFrom('audit_log').execute();
    await sql`create table after_backup (id int primary key)`.execute(db);
    const changed = await snapshot(db);
    expect(changed.tables.parts.md5).not.toBe(original.tables.parts.md5);
    expect(changed.tables.audit_log.rows).toBe(0);

    const r = await script('db-restore.sh', [dumpFile, '--yes']);
    expect(r.code).toBe(0);
    const restored = await snapshot(db);
    // A table the dump does not know is left alone (pg_restore --clean drops only what it restores);
    // md5 of the empty string, RFC 1321 appendix A.5.
    expect(restored.tables.after_backup).toEqual({ rows: 0, md5: 'd41d8cd98f00b204e9800998ecf8427e' });
    delete restored.tables.after_backup;
    expect(restored.tables).toEqual(original.tables);
    expect(restored.sequences).toEqual(original.sequences);
    await sql`drop table after_backup`.execute(db);
  });

  test('a dump that breaks off half way changes nothing (the restore is one transaction)', async () => {
    const db = scratch!;
    await db.deleteFrom('audit_log').execute();
    const before = await snapshot(db);
    const whole = await readFile(dumpFile);
    const broken = path.join(dir, 'broken.dump');
    await writeFile(broken, whole.subarray(0, Math.floor(whole.length * 0.85)));

    const r = await script('db-restore.sh', [broken, '--yes']);
    expect(r.code).not.toBe(0);
    expect(await snapshot(db)).toEqual(before);
  });

  test('db:restore refuses without a file, or with a file that is not there, and touches nothing', async () => {
    const before = await snapshot(scratch!);
    const none = await script('db-restore.sh', []);
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/refusing to restore: name the dump/);
    const missing = await script('db-restore.sh', [path.join(dir, 'no-such.dump')]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/refusing to restore: no such file/);
    expect(await snapshot(scratch!)).toEqual(before);
  });
});
