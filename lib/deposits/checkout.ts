import type Stripe from 'stripe';
import { CHECKOUT_TTL_SECONDS } from '@/lib/sales/checkout';

// The processor calls a deposit makes, each with an idempotency key derived from the deposit's id, so a
// retried or doubled call (two clicks, two stewards, a retry after a lost answer) is one call at the
// processor: one checkout session to take it, one refund to give back what is not kept.

export const depositCheckoutKey = (depositId: string) => `ohm-deposit-${depositId}-checkout`;
export const depositReleaseKey = (depositId: string) => `ohm-deposit-${depositId}-release`;

export function depositMetadata(depositId: string, loanId: string, spaceId: string): Record<string, string> {
  return { depositId, loanId, spaceId };
}

export function depositCheckoutParams(input: {
  depositId: string;
  loanId: string;
  spaceId: string;
  amountMinor: number;
  currency: string;
  itemName: string;
  appBaseUrl: string;
  borrowerEmail?: string | null;
  description: string;
  /** Unix seconds on the processor's clock (real time, not the app's test clock). */
  nowSeconds: number;
}): Stripe.Checkout.SessionCreateParams {
  const back = `${input.appBaseUrl.replace(/\/$/, '')}/loans/${encodeURIComponent(input.loanId)}`;
  const metadata = depositMetadata(input.depositId, input.loanId, input.spaceId);
  return {
    mode: 'payment',
    line_items: [
      {
        price_data: {
          currency: input.currency.toLowerCase(),
          unit_amount: input.amountMinor,
          product_data: { name: `Deposit: ${input.itemName}`.slice(0, 250) },
        },
        quantity: 1,
      },
    ],
    success_url: `${back}?deposit=paid`,
    cancel_url: `${back}?deposit=cancelled`,
    client_reference_id: input.depositId,
    metadata,
    payment_intent_data: { description: input.description.slice(0, 1000), metadata },
    ...(input.borrowerEmail ? { customer_email: input.borrowerEmail } : {}),
    expires_at: input.nowSeconds + CHECKOUT_TTL_SECONDS,
  };
}

/** What is kept for charges and what goes back: never more kept than was paid. */
export function splitDeposit(amountMinor: number, chargedMinor: number): { keptMinor: number; releasedMinor: number } {
  const keptMinor = Math.min(amountMinor, Math.max(0, chargedMinor));
  return { keptMinor, releasedMinor: amountMinor - keptMinor };
}
