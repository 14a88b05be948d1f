import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { sweepOverdueSales } from './sweep';
import { log } from '@/lib/log';

// The scheduled sweep (started by ./job-runner.ts): no card sale stays pending for ever, even when
// nobody opens the Books. The processor expires a checkout session itself at its expiry and tells us
// by webhook, so the job is for the sales whose event never came: it looks only at sales some minutes
// past their expiry, leaving the processor's own event (and the status page) time to end them first.

export const SALE_SWEEP_QUEUE = 'sale-sweep';
/** Every five minutes. */
export const SALE_SWEEP_CRON = '*/5 * * * *';
/** How long past its expiry a sale is left to the processor's own expiry event. */
export const SALE_SWEEP_GRACE_MS = 10 * 60_000;

export type SaleSweepRun = {
  spaces: number;
  checked: number;
  paid: number;
  expired: number;
  failed: number;
  refused: number;
  stillOpen: number;
  /** Spaces whose processor could not be reached or answered with an error: asked again next time. */
  spacesNotReached: number;
  /** Sales found paid, whose receipts are owed. */
  receipts: string[];
};

/** Sweeps every space (or the given ones) that has a card sale pending past its expiry and the grace. */
export async function runSaleSweep(
  db: Db,
  stripeFor: (spaceId: string) => Stripe,
  opts: { now: Date; spaceIds?: string[]; graceMs?: number },
): Promise<SaleSweepRun> {
  const cutoff = new Date(opts.now.getTime() - (opts.graceMs ?? SALE_SWEEP_GRACE_MS));
  const run: SaleSweepRun = {
    spaces: 0,
    checked: 0,
    paid: 0,
    expired: 0,
    failed: 0,
    refused: 0,
    stillOpen: 0,
    spacesNotReached: 0,
    receipts: [],
  };
  if (opts.spaceIds && opts.spaceIds.length === 0) return run;
  // across spaces: the scheduled sweep finds which spaces have sales to sweep, then works per space.
  let q = db
    .selectFrom('sales')
    .select('space_id')
    .distinct()
    .where('method', '=', 'card')
    .where('status', '=', 'pending')
    .where((eb) =>
      eb.or([
        eb('expires_at', '<', cutoff),
        eb.and([eb('checkout_session_id', 'is', null), eb('created_at', '<', cutoff)]),
      ]),
    );
  if (opts.spaceIds) q = q.where('space_id', 'in', opts.spaceIds);
  for (const { space_id: spaceId } of await q.execute()) {
    run.spaces += 1;
    try {
      const r = await sweepOverdueSales(db, stripeFor(spaceId), { spaceId, now: cutoff });
      run.checked += r.checked;
      run.paid += r.paid;
      run.expired += r.expired;
      run.failed += r.failed;
      run.refused += r.refused;
      run.stillOpen += r.stillOpen;
      run.receipts.push(...r.receipts);
      if (r.unreachable) run.spacesNotReached += 1;
    } catch (err) {
      // One space's processor trouble must not stop the others.
      run.spacesNotReached += 1;
      log.error({ spaceId, err: err instanceof Error ? err.message : String(err) }, 'sale sweep failed for a space');
    }
  }
  return run;
}
