// Next calls register() once when a server process starts. The Node.js server first validates the
// environment — a missing or malformed setting (in production: NEXTAUTH_SECRET, STRIPE_SECRET_KEY,
// STRIPE_WEBHOOK_SECRET) stops the start with an error naming it — then starts the durable job runners
// (scheduled loan reminders; the sweep of card sales left pending) unless OHM_JOBS=0. The edge runtime
// has nothing to start.
export async function register(): Promise<void> {
  // The documented shape: the check on Next's own variable stays literal so the edge bundle drops the
  // imports; every other variable is read through lib/env.ts.
  // eslint-disable-next-line no-restricted-properties
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { env } = await import('./lib/env');
    env();
    // The connection's own address on every request, for the sign-in throttle (TRUSTED_PROXY_HOPS).
    const { stampPeerAddress } = await import('./lib/auth/peer');
    stampPeerAddress();
    const { startJobsInThisProcess } = await import('./lib/reminders/start');
    startJobsInThisProcess();
    const { startSaleJobsInThisProcess } = await import('./lib/sales/job-runner');
    startSaleJobsInThisProcess(); // the scheduled sweep of card sales left pending
    const { startBackupJobsInThisProcess } = await import('./lib/backup/job-runner');
    startBackupJobsInThisProcess(); // the nightly backup, where BACKUP_DIR is set (npm run serve)
  }
}
