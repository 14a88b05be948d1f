// Refunds against a succeeded payment intent (or its charge), partial or full, each with its
// negative ledger entry and the `refund.created` / `charge.refunded` events.
import { z } from 'zod';
import { createEvent, type Ctx } from './context';
import { invalid, missing } from './errors';
import { addBalanceTransaction } from './ledger';
import { expand, metadata, positiveInt } from './params';
import { newId, type ApiObject } from './state';

export const createRefundParams = z
  .object({
    payment_intent: z.string().optional(),
    charge: z.string().optional(),
    amount: positiveInt.optional(),
    reason: z.enum(['duplicate', 'fraudulent', 'requested_by_customer']).optional(),
    metadata: metadata.optional(),
    expand,
  })
  .strict();

function chargeToRefund(ctx: Ctx, p: z.infer<typeof createRefundParams>): ApiObject {
  if (p.payment_intent && p.charge)
    throw invalid('Pass either payment_intent or charge, not both.', 'charge');
  if (p.charge) {
    const charge = ctx.state.charges[p.charge];
    if (!charge) throw missing('charge', p.charge, 'charge');
    return charge;
  }
  if (!p.payment_intent)
    throw invalid('Missing required param: payment_intent.', 'payment_intent', 'parameter_missing');
  const pi = ctx.state.paymentIntents[p.payment_intent];
  if (!pi) throw missing('payment_intent', p.payment_intent, 'payment_intent');
  if (pi.status !== 'succeeded') {
    throw invalid(
      `This PaymentIntent (${pi.id}) does not have a successful charge to refund.`,
      'payment_intent',
      'charge_not_refundable',
    );
  }
  return ctx.state.charges[pi.latest_charge as string];
}

export function createRefund(ctx: Ctx, p: z.infer<typeof createRefundParams>): ApiObject {
  const charge = chargeToRefund(ctx, p);
  if (charge.status !== 'succeeded')
    throw invalid(
      `Charge ${charge.id} did not succeed; nothing to refund.`,
      'charge',
      'charge_not_refundable',
    );
  const remaining = (charge.amount as number) - (charge.amount_refunded as number);
  if (remaining <= 0)
    throw invalid(`Charge ${charge.id} has already been refunded.`, 'charge', 'charge_already_refunded');
  const amount = p.amount ?? remaining;
  if (amount > remaining) {
    throw invalid(
      `Refund amount (${amount}) is greater than the unrefunded amount on the charge (${remaining}).`,
      'amount',
      'amount_too_large',
    );
  }
  const refund: ApiObject = {
    id: newId('re'),
    object: 'refund',
    amount,
    balance_transaction: null,
    charge: charge.id,
    created: ctx.now(),
    currency: charge.currency,
    livemode: false,
    metadata: p.metadata ?? {},
    payment_intent: charge.payment_intent,
    reason: p.reason ?? null,
    status: 'succeeded',
  };
  const txn = addBalanceTransaction(ctx, {
    type: 'refund',
    amount: -amount,
    currency: charge.currency as string,
    source: refund.id,
    description: `Refund of ${charge.id}`,
  });
  refund.balance_transaction = txn.id;
  ctx.state.refunds[refund.id] = refund;
  charge.amount_refunded = (charge.amount_refunded as number) + amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  createEvent(ctx, 'refund.created', refund);
  createEvent(ctx, 'charge.refunded', charge);
  return refund;
}
