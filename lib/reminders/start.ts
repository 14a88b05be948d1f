import { startReminderJobs } from './jobs';

/**
 * Starts the reminder job runner in this server process unless OHM_JOBS=0. A database that is not up
 * yet must not stop the app from serving: log, and try again in 30 s.
 */
export function startJobsInThisProcess(env: NodeJS.ProcessEnv = process.env): void {
  if (env.OHM_JOBS === '0' || !env.DATABASE_URL) return;
  const url = env.DATABASE_URL;
  const attempt = () =>
    startReminderJobs(url).catch((err: Error) => {
      console.error('[jobs] reminder runner did not start; retrying in 30 s:', err.message);
      setTimeout(attempt, 30_000).unref();
    });
  void attempt();
}
