// Next calls register() once when a server process starts. The Node.js server starts the durable job
// runners (scheduled loan reminders; the sweep of card sales left pending); the edge runtime has nothing
// to start. OHM_JOBS=0 turns them off (a second app process that should only serve pages, or a script
// that imports the app).
export async function register(): Promise<void> {
  // The documented shape: the import sits inside the runtime check so the edge bundle never sees it.
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { startJobsInThisProcess } = await import('./lib/reminders/start');
    startJobsInThisProcess();
    const { startSaleJobsInThisProcess } = await import('./lib/sales/job-runner');
    startSaleJobsInThisProcess(); // the scheduled sweep of card sales left pending
  }
}
