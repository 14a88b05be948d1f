import 'server-only';
import PgBoss from 'pg-boss';
import { createDb } from '@/db/connect';
import { now } from '@/lib/clock';
import { env } from '@/lib/env';
import { log, withJobRunId } from '@/lib/log';
import { runNightlyBackup } from './run';

// The nightly backup on pg-boss, in the app process, like the other scheduled jobs (lib/sales/job-runner.ts):
// the schedule lives in PostgreSQL, so with several app processes one backup runs per night. Only where
// BACKUP_DIR is set (`npm run serve` requires it; the demo and the tests leave it out).

export const BACKUP_QUEUE = 'nightly-backup';
/** 02:30 UTC every night. */
export const BACKUP_CRON = '30 2 * * *';

const g = globalThis as typeof globalThis & { ohmBackupRunner?: Promise<PgBoss> };

function startBackupJobs(connectionString: string, dir: string): Promise<PgBoss> {
  g.ohmBackupRunner ??= (async () => {
    const boss = new PgBoss({ connectionString, max: 2, application_name: 'ohmstead-backup' });
    boss.on('error', (err) => log.error({ err: err.message }, 'job queue error'));
    const db = createDb(connectionString, 2);
    await boss.start();
    await boss.createQueue(BACKUP_QUEUE, { name: BACKUP_QUEUE, policy: 'stately', retryLimit: 0 });
    await boss.schedule(BACKUP_QUEUE, BACKUP_CRON, {}, { tz: 'UTC' });
    await boss.work(BACKUP_QUEUE, () => withJobRunId(() => runNightlyBackup(db, { dir, databaseUrl: connectionString }, now())));
    return boss;
  })().catch((err) => {
    g.ohmBackupRunner = undefined;
    throw err;
  });
  return g.ohmBackupRunner;
}

/** Starts the nightly backup in this server process when BACKUP_DIR is set and jobs are on. */
export function startBackupJobsInThisProcess(): void {
  const e = env();
  if (e.OHM_JOBS === '0' || !e.BACKUP_DIR) return;
  const dir = e.BACKUP_DIR;
  const attempt = () =>
    startBackupJobs(e.DATABASE_URL, dir).catch((err: Error) => {
      log.error({ err: err.message }, 'nightly backup did not start; retrying in 30 s');
      setTimeout(attempt, 30_000).unref();
    });
  void attempt();
}
