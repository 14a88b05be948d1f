import { env } from '@/lib/env';
import { startReminderJobs } from './jobs';
import { log } from '@/lib/log';

/**
 * Starts the reminder job runner in this server process unless OHM_JOBS=0. A database that is not up
 * yet must not stop the app from serving: log, and try again in 30 s.
 */
export function startJobsInThisProcess(): void {
  const e = env();
  if (e.OHM_JOBS === '0') return;
  const url = e.DATABASE_URL;
  const attempt = () =>
    startReminderJobs(url).catch((err: Error) => {
      log.error({ err: err.message }, 'reminder runner did not start; retrying in 30 s');
      setTimeout(attempt, 30_000).unref();
    });
  void attempt();
}
