import 'server-only';
import PgBoss from 'pg-boss';
import { createDb } from '@/db/connect';
import { now } from '@/lib/clock';
import { env } from '@/lib/env';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { runSaleSweep, SALE_SWEEP_CRON, SALE_SWEEP_QUEUE } from './jobs';
import { log, withJobRunId } from '@/lib/log';
import { DEPOSIT_RELEASE_CRON, DEPOSIT_RELEASE_QUEUE, runDepositReleaseRetry } from '@/lib/deposits/jobs';

// Runs the scheduled sale sweep (./jobs.ts) on pg-boss, in the app process, the same way the reminder
// sweep runs (lib/reminders/jobs.ts): the schedule lives in PostgreSQL, so several app processes share
// one timetable, and the sweep is safe to repeat (every change it makes is a guarded status change).

const g = globalThis as typeof globalThis & { ohmSaleSweepRunner?: Promise<PgBoss> };

function startSaleJobs(connectionString: string): Promise<PgBoss> {
  g.ohmSaleSweepRunner ??= (async () => {
    const boss = new PgBoss({ connectionString, max: 2, application_name: 'ohmstead-sale-jobs' });
    boss.on('error', (err) => log.error({ err: err.message }, 'job queue error'));
    const db = createDb(connectionString, 2);
    await boss.start();
    // 'stately': at most one sweep queued and one running at any time.
    await boss.createQueue(SALE_SWEEP_QUEUE, { name: SALE_SWEEP_QUEUE, policy: 'stately', retryLimit: 3 });
    await boss.schedule(SALE_SWEEP_QUEUE, SALE_SWEEP_CRON, {}, { tz: 'UTC' });
    await boss.work(SALE_SWEEP_QUEUE, () =>
      withJobRunId(async () => {
        const run = await runSaleSweep(db, paymentsClient, { now: now() });
        await sendReceipts(db, run.receipts);
        if (run.checked || run.spacesNotReached)
          log.info({ job: 'sale-sweep', ...run, receipts: run.receipts.length }, 'sale sweep');
      }),
    );
    // The retry of deposits whose release the processor did not take (lib/deposits/jobs.ts), same boss.
    await boss.createQueue(DEPOSIT_RELEASE_QUEUE, { name: DEPOSIT_RELEASE_QUEUE, policy: 'stately', retryLimit: 3 });
    await boss.schedule(DEPOSIT_RELEASE_QUEUE, DEPOSIT_RELEASE_CRON, {}, { tz: 'UTC' });
    await boss.work(DEPOSIT_RELEASE_QUEUE, () =>
      withJobRunId(async () => {
        const run = await runDepositReleaseRetry(db, paymentsClient, { now: now() });
        if (run.checked) log.info({ job: 'deposit-release-retry', ...run }, 'deposit release retry');
      }),
    );
    return boss;
  })().catch((err) => {
    g.ohmSaleSweepRunner = undefined;
    throw err;
  });
  return g.ohmSaleSweepRunner;
}

/** Starts the sale sweep in this server process unless OHM_JOBS=0; a database not up yet is retried in 30 s. */
export function startSaleJobsInThisProcess(): void {
  const e = env();
  if (e.OHM_JOBS === '0') return;
  const url = e.DATABASE_URL;
  const attempt = () =>
    startSaleJobs(url).catch((err: Error) => {
      log.error({ err: err.message }, 'sale sweep did not start; retrying in 30 s');
      setTimeout(attempt, 30_000).unref();
    });
  void attempt();
}
