import 'server-only';
import PgBoss from 'pg-boss';
import { createDb, type Db } from '@/db/connect';
import { now } from '@/lib/clock';
import { runReminderSweep } from './sweep';
import { log, withJobRunId } from '@/lib/log';

// The durable job runner: pg-boss keeps its queue and schedule in PostgreSQL (schema `pgboss`), so a
// schedule survives restarts and several app processes share one timetable (each cron slot runs once).
// The sweep itself is idempotent, so a job retried after a crash cannot send anything twice.

export const SWEEP_QUEUE = 'reminder-sweep';
/** Every ten minutes: a reminder goes out within minutes of its local day starting. */
export const SWEEP_CRON = '*/10 * * * *';

type Runner = { boss: PgBoss; db: Db };
const g = globalThis as typeof globalThis & { ohmReminderRunner?: Promise<Runner> };

export function startReminderJobs(connectionString: string): Promise<Runner> {
  g.ohmReminderRunner ??= (async () => {
    const boss = new PgBoss({ connectionString, max: 2, application_name: 'ohmstead-jobs' });
    boss.on('error', (err) => log.error({ err: err.message }, 'job queue error'));
    const db = createDb(connectionString, 2);
    await boss.start();
    // 'stately': at most one sweep queued and one running at any time.
    await boss.createQueue(SWEEP_QUEUE, {
      name: SWEEP_QUEUE,
      policy: 'stately',
      retryLimit: 5,
      retryDelay: 60,
      retryBackoff: true,
    });
    await boss.schedule(SWEEP_QUEUE, SWEEP_CRON, {}, { tz: 'UTC' });
    await boss.work(SWEEP_QUEUE, () =>
      withJobRunId(async () => {
        const result = await runReminderSweep(db, now());
        if (result.queued || result.sent || result.failed || result.holdNotices)
          log.info({ job: 'reminder-sweep', ...result }, 'reminder sweep');
      }),
    );
    // Catch up at start: whatever came due while the app was down goes out now, not at the next slot.
    await boss.send(SWEEP_QUEUE, {});
    return { boss, db };
  })().catch((err) => {
    g.ohmReminderRunner = undefined;
    throw err;
  });
  return g.ohmReminderRunner;
}
