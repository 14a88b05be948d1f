import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { log } from '@/lib/log';
import { sendRelease } from './release';

// The scheduled retry of deposits left `releasing` (release pending): the refund was fixed when the
// return was confirmed, but the processor did not take it (down, or failing on its side). Run on the sale
// sweep's pg-boss (lib/sales/job-runner.ts). Each try is sendRelease with the deposit's own idempotency
// key, so however often it runs (or a steward presses "send it again" meanwhile) it is one refund.

export const DEPOSIT_RELEASE_QUEUE = 'deposit-release-retry';
/** Every five minutes. */
export const DEPOSIT_RELEASE_CRON = '*/5 * * * *';
/** A release this fresh is left to the confirming request and the refund's own event. */
export const DEPOSIT_RELEASE_GRACE_MS = 2 * 60_000;

export type DepositReleaseRun = { checked: number; released: number; stillPending: number };

export async function runDepositReleaseRetry(
  db: Db,
  stripeFor: (spaceId: string) => Stripe,
  opts: { now: Date; spaceIds?: string[]; graceMs?: number },
): Promise<DepositReleaseRun> {
  const run: DepositReleaseRun = { checked: 0, released: 0, stillPending: 0 };
  if (opts.spaceIds && opts.spaceIds.length === 0) return run;
  const cutoff = new Date(opts.now.getTime() - (opts.graceMs ?? DEPOSIT_RELEASE_GRACE_MS));
  // across spaces: the scheduled retry finds the deposits waiting to go back, then works per space.
  let q = db
    .selectFrom('deposits')
    .select(['id', 'space_id'])
    .where('status', '=', 'releasing')
    .where('release_started_at', '<=', cutoff)
    .orderBy('release_started_at')
    .limit(200);
  if (opts.spaceIds) q = q.where('space_id', 'in', opts.spaceIds);
  for (const d of await q.execute()) {
    run.checked += 1;
    let released = false;
    try {
      released = await sendRelease(db, stripeFor(d.space_id), d.space_id, d.id);
    } catch (err) {
      log.error({ depositId: d.id, err: err instanceof Error ? err.message : String(err) }, 'deposit release retry failed');
    }
    if (released) run.released += 1;
    else run.stillPending += 1;
  }
  return run;
}
