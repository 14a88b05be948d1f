import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { PAYMENT_REFUSED } from '@/lib/sales/refused';

// The Books' "to investigate" list: payments the processor reported that Ohmstead refused to count
// (lib/sales/accept.ts, lib/payments/events.ts). Nothing changed because of them, but the processor
// may hold money for them, so the treasurer looks into each (and refunds it there if it is not ours).

export type ToInvestigate = {
  at: string;
  type: string;
  eventId: string | null;
  objectId: string | null;
  saleId: string | null;
  amountMinor: number | null;
  currency: string | null;
  why: string;
};

type Detail = {
  type?: string;
  eventId?: string | null;
  objectId?: string;
  amountMinor?: number | null;
  currency?: string | null;
  why?: string;
};

/** The refused payments written down in [from, to), oldest first. */
export async function refusedPayments(
  db: Db,
  spaceId: string,
  from: Date,
  to: Date,
): Promise<ToInvestigate[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('audit_log')
    .select(['created_at', 'target_id', sql<Detail>`detail`.as('detail')])
    .where('space_id', '=', spaceId)
    .where('action', '=', PAYMENT_REFUSED)
    .where('created_at', '>=', from)
    .where('created_at', '<', to)
    .orderBy('created_at')
    .orderBy('id')
    .execute();
  return rows.map((r) => ({
    at: r.created_at.toISOString(),
    type: r.detail.type ?? 'payment',
    eventId: r.detail.eventId ?? null,
    objectId: r.detail.objectId && r.detail.objectId !== '-' ? r.detail.objectId : null,
    saleId: r.target_id,
    amountMinor: typeof r.detail.amountMinor === 'number' ? r.detail.amountMinor : null,
    currency: r.detail.currency ? r.detail.currency.toUpperCase() : null,
    why: r.detail.why ?? '',
  }));
}
