import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { isProcessorUnreachable } from './processor-errors';
import { settleSale } from './settle';

export type SweepResult = {
  checked: number;
  paid: number;
  expired: number;
  failed: number;
  stillOpen: number;
  /** Paid at the processor, but not as this sale's payment: left pending, listed for the treasurer. */
  refused: number;
  unreachable: boolean;
  receipts: string[];
};

/** A sale whose payment page was never handed out is given this long before it counts as failed. */
const NO_SESSION_GRACE_MS = 5 * 60_000;

/** The space's pending card sales that are due for a sweep. */
function overdue(db: Db, opts: { spaceId: string; now: Date }) {
  return scoped(db, opts)
    .selectFrom('sales')
    .where('space_id', '=', opts.spaceId)
    .where('method', '=', 'card')
    .where('status', '=', 'pending')
    .where((eb) =>
      eb.or([
        eb('expires_at', '<', opts.now),
        eb.and([
          eb('checkout_session_id', 'is', null),
          eb('created_at', '<', new Date(opts.now.getTime() - NO_SESSION_GRACE_MS)),
        ]),
      ]),
    );
}

/** How many sales a sweep would ask the processor about (read only: the Books page shows it). */
export async function countOverdueSales(db: Db, opts: { spaceId: string; now: Date }): Promise<number> {
  const row = await overdue(db, opts)
    .select((eb) => eb.fn.countAll<string>().as('n'))
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/**
 * No card sale stays pending for ever: every pending sale of the space past its expiry (or with no
 * checkout session after a few minutes) is settled with the processor: paid, expired (an open session
 * is expired first) or failed. If the processor cannot be reached the sales stay pending and the next
 * sweep asks again; nothing is guessed. Returns the sales that became paid, whose receipts are owed.
 */
export async function sweepOverdueSales(
  db: Db,
  stripe: Stripe,
  opts: { spaceId: string; now: Date; limit?: number },
): Promise<SweepResult> {
  const due = await overdue(db, opts)
    .select(['id', 'space_id', 'status', 'checkout_session_id', 'total_minor', 'currency'])
    .orderBy('created_at')
    .limit(opts.limit ?? 50)
    .execute();

  const result: SweepResult = {
    checked: 0,
    paid: 0,
    expired: 0,
    failed: 0,
    stillOpen: 0,
    refused: 0,
    unreachable: false,
    receipts: [],
  };
  for (const sale of due) {
    try {
      const settled = await settleSale(db, stripe, sale, { expireOpen: true, source: 'sweep' });
      result.checked += 1;
      if (settled.status === 'paid') result.paid += 1;
      else if (settled.status === 'expired') result.expired += 1;
      else if (settled.status === 'failed') result.failed += 1;
      else if (settled.refused) result.refused += 1;
      else result.stillOpen += 1;
      if (settled.receipt) result.receipts.push(sale.id);
    } catch (err) {
      if (!isProcessorUnreachable(err)) throw err;
      result.unreachable = true;
      break;
    }
  }
  return result;
}
