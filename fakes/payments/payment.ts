// Paying a checkout session with a test card: the payment intent (made at the first attempt, like the
// real API), a charge, the ledger entry with its fee, and the events the real processor sends.
import { cardOutcome, DECLINE_CARD, SUCCESS_CARD } from './cards';
import { getSession } from './checkout';
import { createEvent, type Ctx } from './context';
import { ApiError, invalid } from './errors';
import { addBalanceTransaction } from './ledger';
import { newId, type ApiObject } from './state';

export type PayResult =
  | { outcome: 'paid'; session: ApiObject; payment_intent: ApiObject; charge: ApiObject }
  | {
      outcome: 'declined';
      session: ApiObject;
      payment_intent: ApiObject;
      charge: ApiObject;
      message: string;
      decline_code: string;
    };

function ensurePaymentIntent(ctx: Ctx, session: ApiObject): ApiObject {
  const existing = session.payment_intent
    ? ctx.state.paymentIntents[session.payment_intent as string]
    : undefined;
  if (existing) return existing;
  const extra = session._payment_intent_data as { description?: string; metadata?: Record<string, string> };
  const pi: ApiObject = {
    id: newId('pi'),
    object: 'payment_intent',
    amount: session.amount_total,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic',
    client_secret: null,
    confirmation_method: 'automatic',
    created: ctx.now(),
    currency: session.currency,
    customer: null,
    description: extra.description ?? null,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: extra.metadata ?? {},
    payment_method_types: ['card'],
    status: 'requires_payment_method',
  };
  pi.client_secret = `${pi.id}_secret_${newId('x', 16).slice(2)}`;
  ctx.state.paymentIntents[pi.id] = pi;
  session.payment_intent = pi.id;
  createEvent(ctx, 'payment_intent.created', pi);
  return pi;
}

function chargeObject(
  ctx: Ctx,
  pi: ApiObject,
  card: { brand: string; last4: string },
  succeeded: boolean,
): ApiObject {
  const charge: ApiObject = {
    id: newId('ch'),
    object: 'charge',
    amount: pi.amount,
    amount_captured: succeeded ? pi.amount : 0,
    amount_refunded: 0,
    balance_transaction: null,
    captured: succeeded,
    created: ctx.now(),
    currency: pi.currency,
    customer: null,
    description: pi.description,
    failure_code: null,
    failure_message: null,
    livemode: false,
    metadata: { ...(pi.metadata as object) },
    outcome: succeeded
      ? {
          network_status: 'approved_by_network',
          reason: null,
          risk_level: 'normal',
          seller_message: 'Payment complete.',
          type: 'authorized',
        }
      : {
          network_status: 'declined_by_network',
          reason: 'generic_decline',
          risk_level: 'normal',
          seller_message: 'The bank did not return any further details with this decline.',
          type: 'issuer_declined',
        },
    paid: succeeded,
    payment_intent: pi.id,
    payment_method_details: {
      type: 'card',
      card: {
        brand: card.brand,
        last4: card.last4,
        exp_month: 12,
        exp_year: 2034,
        funding: 'credit',
        country: null,
      },
    },
    refunded: false,
    status: succeeded ? 'succeeded' : 'failed',
  };
  ctx.state.charges[charge.id] = charge;
  return charge;
}

export function paySession(ctx: Ctx, sessionId: string, cardNumber: string): PayResult {
  const session = getSession(ctx, sessionId);
  if (session.status !== 'open') {
    throw invalid(`This Checkout Session is ${String(session.status)} and can no longer be paid.`, 'session');
  }
  const card = cardOutcome(cardNumber);
  if (!card) {
    throw new ApiError(
      402,
      'card_error',
      `Your card number is not a test card of the payments fake: use ${SUCCESS_CARD} (succeeds) or ${DECLINE_CARD} (declined).`,
      'incorrect_number',
      'card[number]',
    );
  }
  const pi = ensurePaymentIntent(ctx, session);

  if (card.kind === 'declined') {
    const charge = chargeObject(ctx, pi, card, false);
    Object.assign(charge, { failure_code: 'card_declined', failure_message: card.message });
    (charge.outcome as Record<string, unknown>).reason = card.declineCode;
    Object.assign(pi, {
      latest_charge: charge.id,
      status: 'requires_payment_method',
      last_payment_error: {
        type: 'card_error',
        code: 'card_declined',
        decline_code: card.declineCode,
        message: card.message,
        charge: charge.id,
      },
    });
    createEvent(ctx, 'charge.failed', charge);
    createEvent(ctx, 'payment_intent.payment_failed', pi);
    return {
      outcome: 'declined',
      session,
      payment_intent: pi,
      charge,
      message: card.message,
      decline_code: card.declineCode,
    };
  }

  const charge = chargeObject(ctx, pi, card, true);
  const txn = addBalanceTransaction(ctx, {
    type: 'charge',
    amount: charge.amount as number,
    currency: charge.currency as string,
    source: charge.id,
    description: (pi.description as string | null) ?? `Checkout ${session.id}`,
  });
  charge.balance_transaction = txn.id;
  Object.assign(pi, {
    status: 'succeeded',
    amount_received: pi.amount,
    latest_charge: charge.id,
    last_payment_error: null,
  });
  const email = (session.customer_email as string | null) ?? null;
  Object.assign(session, {
    status: 'complete',
    payment_status: 'paid',
    url: null,
    customer_details: { email, name: null, phone: null, address: null, tax_exempt: 'none', tax_ids: [] },
  });
  createEvent(ctx, 'charge.succeeded', charge);
  createEvent(ctx, 'payment_intent.succeeded', pi);
  createEvent(ctx, 'checkout.session.completed', session);
  return { outcome: 'paid', session, payment_intent: pi, charge };
}
