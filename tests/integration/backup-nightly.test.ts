import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '@/db/connect';
import { runNightlyBackup } from '@/lib/backup/run';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeLocation, makePart, makeSpace, makeUser, testDb } from '../helpers/db';

// The nightly backup, night after night on a moved clock (each run is handed the night's time, as the
// scheduled job hands it lib/clock's now()): every night a dump, and the folder pruned to the newest of
// each of the last 7 days and of each of the last 4 weeks. The newest restores into a fresh cluster with
// every table's row count and checksum identical (the restore drill). A failing backup e-mails the admins.
const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);
const dbName = `ohm_nightly_${Date.now().toString(36)}_${randomBytes(3).toString('hex')}`;
const dir = mkdtempSync('/var/tmp/ohm-nightly.');
let url: string;
let scratch: Db;
let adminEmail: string;

beforeAll(async () => {
  await sql`create database ${sql.id(dbName)}`.execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  url = u.toString();
  await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), 'scripts/migrate.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url }, timeout: 120_000 });
  scratch = createDb(url, 2);
  const space = await makeSpace(scratch, { name: 'Nightly test space' });
  adminEmail = (await makeUser(scratch, space.id, ['admin'], 'Backup admin')).email;
  await makeUser(scratch, space.id, ['member'], 'Jörg Ümlaut “quoted”');
  const bin = await makeLocation(scratch, space.id);
  for (let i = 0; i < 5; i++) await makePart(scratch, space.id, { name: `Part ${i} – Ω` });
  await scratch.insertInto('stock').values({ space_id: space.id, part_id: (await makePart(scratch, space.id)).id, location_id: bin.id, qty: 7 }).execute();
  writeFileSync(path.join(dir, 'before-migrate-20261101T000000Z.dump'), 'kept: not a nightly dump');
}, 180_000);

afterAll(async () => {
  await scratch?.destroy();
  await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
  rmSync(dir, { recursive: true, force: true });
});

describe('nightly backups', () => {
  it('21 nights from Monday 2 November: 7 daily and the weekly ones kept, the rest pruned, each run recorded', { timeout: 300_000 }, async () => {
    for (let night = 0; night < 21; night++) {
      const at = new Date(Date.UTC(2026, 10, 2 + night, 2, 30));
      const r = await runNightlyBackup(scratch, { dir, databaseUrl: url }, at);
      expect(r.ok, r.error).toBe(true);
      expect(r.sizeBytes).toBeGreaterThan(1000);
    }
    const kept = readdirSync(dir).sort();
    expect(kept).toEqual(
      [
        'before-migrate-20261101T000000Z.dump',
        // the weeks of 2 and 9 November: their Sundays
        'nightly-20261108T023000Z.dump',
        'nightly-20261115T023000Z.dump',
        // the last 7 days (16–22 November), the 22nd also this week's
        ...[16, 17, 18, 19, 20, 21, 22].map((d) => `nightly-202611${d}T023000Z.dump`),
      ].sort(),
    );
    const runs = await scratch.selectFrom('backup_runs').select(['ok', 'size_bytes']).execute();
    expect(runs).toHaveLength(21);
    expect(runs.every((r) => r.ok && Number(r.size_bytes) > 0)).toBe(true);
  });

  it('the newest restores into a fresh cluster with identical row counts and checksums (restore drill)', { timeout: 300_000 }, async () => {
    // The drill compares against the database now: nothing may have changed since the last dump, so take one.
    const at = new Date(Date.UTC(2026, 10, 23, 2, 30));
    expect((await runNightlyBackup(scratch, { dir, databaseUrl: url }, at)).ok).toBe(true);
    const drill = await run('bash', ['scripts/db-restore-drill.sh', path.join(dir, 'nightly-20261123T023000Z.dump'), '--compare'], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: url },
      timeout: 240_000,
    });
    expect(drill.stderr).toContain('every table matches the database');
    const lines = drill.stdout.trim().split('\n').map((l) => l.split(' '));
    expect(lines.length).toBeGreaterThanOrEqual(28);
    expect(lines.find((l) => l[0] === 'parts')?.[1]).toBe('6');
    expect(lines.find((l) => l[0] === 'users')?.[1]).toBe('2');

    // A change after the dump is seen: the drill fails naming the table.
    await scratch.updateTable('users').set({ name: 'Changed after the dump' }).where('email', '=', adminEmail).execute();
    const differs = await run('bash', ['scripts/db-restore-drill.sh', path.join(dir, 'nightly-20261123T023000Z.dump'), '--compare'], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: url },
      timeout: 240_000,
    }).then(
      () => ({ code: 0, stderr: '' }),
      (e: { code: number; stderr: string }) => e,
    );
    expect(differs.code).toBe(1);
    expect(differs.stderr).toMatch(/^users$/m);
  });

  it('a failing backup is recorded, leaves the kept dumps alone, and e-mails the admins', { timeout: 120_000 }, async () => {
    const before = readdirSync(dir).sort();
    const at = new Date(Date.UTC(2026, 10, 24, 2, 30));
    const r = await runNightlyBackup(scratch, { dir, databaseUrl: 'postgres://postgres@127.0.0.1:1/nothing_here' }, at);
    expect(r.ok).toBe(false);
    expect(readdirSync(dir).sort()).toEqual(before);
    const row = await scratch.selectFrom('backup_runs').selectAll().where('ok', '=', false).executeTakeFirstOrThrow();
    expect(row.error).toBeTruthy();
    expect(row.error).not.toContain('postgres://');
    const mail = await waitForMessage({ to: adminEmail, match: (m) => /backup failed/.test(m.subject), timeoutMs: 15_000 });
    expect(mail.text).toContain(at.toISOString());
    expect(mail.text).not.toContain('postgres://');
  });
});
