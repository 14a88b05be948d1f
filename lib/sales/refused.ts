import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';

// A payment Ohmstead refused to count (a checkout session it did not open for the sale, or money that
// is not the sale's exact amount and currency) changes nothing, but the treasurer must hear of it: the
// processor may hold money for it. It is written to the audit log once per sale and processor object
// (however many deliveries or status checks report it) and listed in the Books under "to investigate".

export const PAYMENT_REFUSED = 'payment.refused';

export type RefusedPayment = {
  spaceId: string | null;
  /** The sale it was for, or claimed to be for (metadata anyone can write). */
  saleId: string | null;
  /** What told us: a processor event type, or 'status check' / 'sweep'. */
  type: string;
  eventId: string | null;
  /** The processor's object: checkout session, payment intent, refund. */
  objectId: string | null;
  amountMinor: number | null;
  currency: string | null;
  why: string;
};

/** Run in the caller's transaction. Returns false when the same refusal was already written down. */
export async function recordRefusedPayment(trx: Db, r: RefusedPayment): Promise<boolean> {
  if (!r.spaceId) return false; // names no space of ours: only payment_events keeps it
  const key = `${r.spaceId}:${r.saleId ?? '-'}:${r.objectId ?? '-'}`;
  await sql`select pg_advisory_xact_lock(hashtext(${key}))`.execute(trx);
  let seen = scoped(trx, { spaceId: r.spaceId })
    .selectFrom('audit_log')
    .select('id')
    .where('space_id', '=', r.spaceId)
    .where('action', '=', PAYMENT_REFUSED)
    .where(sql<string>`detail->>'objectId'`, '=', r.objectId ?? '-');
  seen = r.saleId ? seen.where('target_id', '=', r.saleId) : seen.where('target_id', 'is', null);
  if (await seen.executeTakeFirst()) return false;
  await audit(trx, {
    spaceId: r.spaceId,
    actorId: null,
    action: PAYMENT_REFUSED,
    targetType: 'sale',
    ...(r.saleId ? { targetId: r.saleId } : {}),
    detail: {
      type: r.type,
      eventId: r.eventId,
      objectId: r.objectId ?? '-',
      amountMinor: r.amountMinor,
      currency: r.currency,
      why: r.why,
    },
  });
  return true;
}
