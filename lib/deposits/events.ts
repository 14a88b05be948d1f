import 'server-only';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { DepositsTable } from '@/db/types';
import type { Selectable } from 'kysely';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { computeDueAt } from '@/lib/loans/due';
import { giveUpWaitingLoan } from '@/lib/loans/cancel';
import { loanSettings } from '@/lib/loans/settings';
import { refuseUnlessOwnSession } from '@/lib/sales/accept';
import { recordRefusedPayment } from '@/lib/sales/refused';
import { bookRelease } from './release';

// The processor's events about a deposit, found (like a sale's) only through ids Ohmstead stored: the
// checkout session it opened for the deposit, or the payment intent of the deposit it accepted. Each
// change is a guarded status transition (pending → held, pending → ended, releasing → released), so a
// duplicate or late delivery changes nothing. lib/payments/events.ts calls this inside its transaction,
// after writing the event id down once.

export type Deposit = Selectable<DepositsTable>;
export type DepositOutcome = { outcome: string; depositsToRelease: { spaceId: string; depositId: string }[] };

const idOf = (v: unknown) =>
  typeof v === 'string' ? v : v && typeof v === 'object' && 'id' in v ? String((v as { id: string }).id) : null;

/** The deposit an event is about, by the session or payment id stored on it. */
export async function ourDeposit(trx: Db, event: Stripe.Event): Promise<Deposit | undefined> {
  const obj = event.data.object as { id?: string; payment_intent?: unknown };
  // across spaces: the event names no space we trust; the stored session or payment id finds the deposit.
  const q = trx.selectFrom('deposits').selectAll();
  if (event.type.startsWith('checkout.session.'))
    return obj.id ? q.where('checkout_session_id', '=', obj.id).forUpdate().executeTakeFirst() : undefined;
  const pi = event.type.startsWith('payment_intent.') ? (obj.id ?? null) : idOf(obj.payment_intent);
  return pi ? q.where('payment_intent_id', '=', pi).forUpdate().executeTakeFirst() : undefined;
}

const done = (outcome: string, release: DepositOutcome['depositsToRelease'] = []): DepositOutcome => ({
  outcome,
  depositsToRelease: release,
});

export async function applyDepositEvent(trx: Db, d: Deposit, event: Stripe.Event): Promise<DepositOutcome> {
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object as Stripe.Checkout.Session;
      if (session.payment_status !== 'paid') return done('deposit: session complete, not yet paid');
      // The sales' own rule (session, amount, currency); the session is the one the deposit was found by.
      const why = await refuseUnlessOwnSession(
        trx,
        { id: d.id, spaceId: d.space_id, what: 'deposit', checkout_session_id: d.checkout_session_id, total_minor: d.amount_minor, currency: d.currency },
        event,
        session,
      );
      if (why) return done(`refused: deposit ${why}`);
      const paidAt = new Date(event.created * 1000);
      const pi = idOf(session.payment_intent);
      if (d.status === 'ended') {
        // Paid after the borrow was given up (the pay page was still open): all of it goes back.
        const late = await scoped(trx, { spaceId: d.space_id })
          .updateTable('deposits')
          .set({ status: 'releasing', payment_intent_id: pi, paid_at: paidAt, kept_minor: 0, released_minor: d.amount_minor, release_started_at: now() })
          .where('id', '=', d.id)
          .where('status', '=', 'ended')
          .returning('id')
          .executeTakeFirst();
        if (!late) return done('deposit: no change');
        await audit(trx, {
          spaceId: d.space_id,
          actorId: null,
          action: 'deposit.paid_late',
          targetType: 'loan',
          targetId: d.loan_id,
          detail: { depositId: d.id, amountMinor: d.amount_minor, currency: d.currency, event: event.id },
        });
        return done('deposit paid after the borrow ended: giving it back', [{ spaceId: d.space_id, depositId: d.id }]);
      }
      const held = await scoped(trx, { spaceId: d.space_id })
        .updateTable('deposits')
        .set({ status: 'held', payment_intent_id: pi, paid_at: paidAt })
        .where('id', '=', d.id)
        .where('status', '=', 'pending')
        .returning('starts_as')
        .executeTakeFirst();
      if (!held) return done(`deposit: no change (already ${d.status})`);
      let became = 'waiting';
      if (held.starts_as === 'out') {
        const settings = await loanSettings(trx, d.space_id);
        const at = now();
        const started = await scoped(trx, { spaceId: d.space_id })
          .updateTable('loans')
          .set({ status: 'out', out_at: at, due_at: computeDueAt(at, settings) })
          .where('id', '=', d.loan_id)
          .where('status', '=', 'waiting')
          .returning('id')
          .executeTakeFirst();
        if (started) became = 'out';
      }
      await audit(trx, {
        spaceId: d.space_id,
        actorId: null,
        action: 'deposit.paid',
        targetType: 'loan',
        targetId: d.loan_id,
        detail: { depositId: d.id, amountMinor: d.amount_minor, currency: d.currency, loan: became, event: event.id },
      });
      return done(became === 'out' ? 'deposit held: loan started' : 'deposit held: waiting for the hand-over');
    }
    case 'checkout.session.expired':
    case 'checkout.session.async_payment_failed': {
      if (d.status !== 'pending') return done(`deposit: no change (already ${d.status})`);
      const loan = await scoped(trx, { spaceId: d.space_id })
        .selectFrom('loans')
        .select(['id', 'kit_box_id', 'status'])
        .where('id', '=', d.loan_id)
        .forUpdate()
        .executeTakeFirstOrThrow();
      if (loan.status !== 'waiting') return done(`deposit: no change (loan ${loan.status})`);
      await giveUpWaitingLoan(trx, d.space_id, loan, null, 'the deposit was not paid in time');
      return done('deposit not paid: borrow given up');
    }
    case 'refund.created':
    case 'refund.updated':
    case 'charge.refund.updated': {
      const refund = event.data.object as Stripe.Refund;
      if (refund.status !== 'succeeded' && refund.status !== 'pending') return done(`refund ${refund.status}: nothing to book`);
      if (refund.metadata?.depositId !== d.id || refund.amount !== d.released_minor) {
        if (d.refund_id === refund.id) return done('deposit: refund already booked');
        await recordRefusedPayment(trx, {
          spaceId: d.space_id,
          saleId: null,
          type: event.type,
          eventId: event.id,
          objectId: refund.id,
          amountMinor: refund.amount,
          currency: refund.currency,
          why: `refund ${refund.id} of deposit ${d.id} is not the release Ohmstead asked for`,
        });
        return done('refused: not the deposit release we asked for');
      }
      return done((await bookRelease(trx, d.space_id, d.id, refund.id, event.id)) ? 'deposit released' : 'deposit: release already booked');
    }
    default:
      return done('deposit: nothing to do for this event');
  }
}
