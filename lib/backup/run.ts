import 'server-only';
import { execFile } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { mkdir, rename, stat, unlink } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { log } from '@/lib/log';
import { sendMail } from '@/lib/mail/server';
import { dumpsToKeep, nightlyName, parseNightlyName } from './retention';

// The nightly backup (scheduled by ./job-runner.ts on pg-boss): pg_dump in PostgreSQL's custom format into
// BACKUP_DIR, written to a .partial file and renamed when complete, recorded in backup_runs (Settings shows
// the last one), then the nightly dumps are pruned to 7 daily + 4 weekly (./retention.ts). A failure is
// recorded too and e-mailed to every admin. Dumps made before a migration (scripts/serve.sh) are not pruned.

const run = promisify(execFile);

export type BackupConfig = { dir: string; databaseUrl: string };
export type BackupResult = { ok: boolean; file?: string; sizeBytes?: number; error?: string; pruned: string[] };

/** pg_dump of the newest PostgreSQL on this machine (Debian keeps one per version), else from PATH. */
function pgDump(): string {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return 'pg_dump';
  const versions = readdirSync(root).filter((v) => existsSync(path.join(root, v, 'bin/pg_dump')));
  versions.sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(root, versions[0]!, 'bin/pg_dump') : 'pg_dump';
}

async function prune(dir: string, at: Date): Promise<string[]> {
  const dumps = readdirSync(dir).map(parseNightlyName).filter((d): d is NonNullable<typeof d> => d !== null);
  const keep = dumpsToKeep(dumps, at);
  const gone: string[] = [];
  for (const d of dumps) {
    if (keep.has(d.name)) continue;
    await unlink(path.join(dir, d.name));
    gone.push(d.name);
  }
  return gone;
}

// across spaces: one dump holds every space, so the admins of every space hear that it failed.
async function tellAdmins(db: Db, at: Date, error: string): Promise<void> {
  const admins = await db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select('users.email')
    .distinct()
    .where(sql<boolean>`'admin' = any(memberships.roles)`)
    .where('memberships.disabled_at', 'is', null)
    .where('users.erased_at', 'is', null)
    .execute();
  if (!admins.length) return;
  await sendMail({
    to: admins.map((a) => a.email),
    subject: 'Ohmstead: the nightly backup failed',
    text:
      `The database backup of ${at.toISOString()} did not complete:\n\n${error}\n\n` +
      'The previous backups are untouched. Check the backup folder (free space, permissions) and the log ' +
      '(journalctl -u ohmstead), then see Settings for the last good backup.',
  });
}

export async function runNightlyBackup(db: Db, cfg: BackupConfig, at: Date): Promise<BackupResult> {
  const file = path.join(cfg.dir, nightlyName(at));
  const started = new Date();
  try {
    await mkdir(cfg.dir, { recursive: true });
    await run(pgDump(), ['--format=custom', '--compress=6', `--file=${file}.partial`, `--dbname=${cfg.databaseUrl}`], { timeout: 30 * 60_000 });
    await rename(`${file}.partial`, file);
    const { size } = await stat(file);
    const pruned = await prune(cfg.dir, at);
    await db.insertInto('backup_runs').values({ taken_at: at, started_at: started, finished_at: new Date(), file: path.basename(file), size_bytes: size, ok: true, error: null }).execute();
    log.info({ job: 'nightly-backup', file: path.basename(file), sizeBytes: size, pruned: pruned.length }, 'backup written');
    return { ok: true, file, sizeBytes: size, pruned };
  } catch (err) {
    // The first line only: pg_dump's message, without the connection string it was given.
    const error = ((err as { stderr?: string }).stderr || (err as Error).message || String(err)).split('\n')[0]!.replace(/postgres(ql)?:\/\/\S+/g, '(database)');
    await unlink(`${file}.partial`).catch(() => undefined);
    log.error({ job: 'nightly-backup', err: error }, 'backup failed');
    await db
      .insertInto('backup_runs')
      .values({ taken_at: at, started_at: started, finished_at: new Date(), file: null, size_bytes: null, ok: false, error })
      .execute()
      .catch((e: Error) => log.error({ err: e.message }, 'backup failure not recorded'));
    await tellAdmins(db, at, error).catch((e: Error) => log.error({ err: e.message }, 'backup failure not mailed'));
    return { ok: false, error, pruned: [] };
  }
}

export type LastBackup = { takenAt: Date; ok: boolean; sizeBytes: number | null; error: string | null } | null;

/** The last attempt and the last good one, for Settings. */
export async function lastBackups(db: Db): Promise<{ last: LastBackup; lastGood: LastBackup }> {
  const pick = (r: { taken_at: Date; ok: boolean; size_bytes: string | number | null; error: string | null } | undefined): LastBackup =>
    r ? { takenAt: r.taken_at, ok: r.ok, sizeBytes: r.size_bytes === null ? null : Number(r.size_bytes), error: r.error } : null;
  const last = await db.selectFrom('backup_runs').select(['taken_at', 'ok', 'size_bytes', 'error']).orderBy('finished_at', 'desc').limit(1).executeTakeFirst();
  const good = await db.selectFrom('backup_runs').select(['taken_at', 'ok', 'size_bytes', 'error']).where('ok', '=', true).orderBy('finished_at', 'desc').limit(1).executeTakeFirst();
  return { last: pick(last), lastGood: pick(good) };
}
