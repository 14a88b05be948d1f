import 'server-only';
import Stripe from 'stripe';
import type { Db } from '@/db/connect';
import type { Sale, SaleStatus } from '@/db/types';
import { acceptPayment, type SaleMoney } from './accept';
import { markSaleEnded } from './paid';

/** `refused`: the processor reports money that is not this sale's payment (see ./accept.ts). */
export type Settled = { saleId: string; status: SaleStatus; receipt?: boolean; refused?: string };

const idOf = (v: string | { id: string } | null | undefined) => (typeof v === 'string' ? v : (v?.id ?? null));

/**
 * Asks the processor what became of a pending card sale and records the answer: paid (stock moves,
 * a receipt is owed), expired, or still open. With `expireOpen`, an open session is expired first so
 * the sale can end now. Throws the SDK's error when the processor cannot be reached; callers decide.
 */
export async function settleSale(
  db: Db,
  stripe: Stripe,
  sale: SaleMoney & Pick<Sale, 'status'>,
  opts: { expireOpen: boolean; actorId?: string | null; source: string },
): Promise<Settled> {
  if (sale.status !== 'pending') return { saleId: sale.id, status: sale.status };
  if (!sale.checkout_session_id) {
    // No session id stored means the payment page was never handed out: nobody can pay this sale.
    await db
      .transaction()
      .execute((trx) =>
        markSaleEnded(trx, sale.id, 'failed', { source: opts.source, reason: 'no checkout session' }),
      );
    return { saleId: sale.id, status: 'failed' };
  }
  let session: Stripe.Checkout.Session;
  try {
    session = await stripe.checkout.sessions.retrieve(sale.checkout_session_id, {
      expand: ['payment_intent.latest_charge'],
    });
  } catch (err) {
    // A session the processor does not know can never be paid: the sale has failed.
    if (!(err instanceof Stripe.errors.StripeInvalidRequestError) || err.statusCode !== 404) throw err;
    await db
      .transaction()
      .execute((trx) =>
        markSaleEnded(trx, sale.id, 'failed', { source: opts.source, reason: 'unknown to the processor' }),
      );
    return { saleId: sale.id, status: 'failed' };
  }
  if (session.status === 'open' && opts.expireOpen) {
    try {
      session = await stripe.checkout.sessions.expire(session.id, {
        expand: ['payment_intent.latest_charge'],
      });
    } catch (err) {
      // Paid (or expired) between our two calls: read it again and record whatever it is now.
      if (!(err instanceof Stripe.errors.StripeInvalidRequestError)) throw err;
      session = await stripe.checkout.sessions.retrieve(session.id, {
        expand: ['payment_intent.latest_charge'],
      });
    }
  }
  if (session.payment_status === 'paid') {
    const pi = session.payment_intent;
    const charge = pi && typeof pi === 'object' ? pi.latest_charge : null;
    const chargedAt = charge && typeof charge === 'object' ? new Date(charge.created * 1000) : undefined;
    const out = await db.transaction().execute((trx) =>
      acceptPayment(trx, sale, {
        sessionId: session.id,
        paymentIntentId: idOf(pi),
        amountMinor: session.amount_total,
        currency: session.currency,
        paidAt: chargedAt,
        source: opts.source,
        type: opts.source,
        eventId: null,
      }),
    );
    if ('refused' in out)
      return { saleId: sale.id, status: out.sale?.status ?? sale.status, refused: out.refused };
    return { saleId: sale.id, status: 'paid', receipt: out.changed };
  }
  if (session.status === 'expired') {
    await db
      .transaction()
      .execute((trx) =>
        markSaleEnded(trx, sale.id, 'expired', { source: opts.source, actorId: opts.actorId }),
      );
    return { saleId: sale.id, status: 'expired' };
  }
  return { saleId: sale.id, status: 'pending' };
}
