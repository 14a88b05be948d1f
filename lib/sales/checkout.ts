import type Stripe from 'stripe';
import { formatQty } from '@/lib/inventory/measure';
import { lineAmountMinor } from '@/lib/money';

// The checkout session we ask the processor for: one line per sale line with the price we hold,
// the sale's id three times over (metadata, client_reference_id, payment intent metadata) so every
// event and every ledger entry leads back to the sale, and an expiry so no sale waits for ever.

/** The processor accepts an expiry between 30 minutes and 24 hours ahead; we take 31 minutes. */
export const CHECKOUT_TTL_SECONDS = 31 * 60;

export type CheckoutLine = { name: string; qty: number; unitPriceMinor: number; saleUnit?: string };

/**
 * A pay-page line takes whole quantities only, so a length or weight with a fraction (2.5 m) is one
 * line of its amount — round(qty × price), half away from zero, as the sale holds it — named with
 * the quantity ("Twin lead, 2.5 m"). Whole quantities stay quantity × price.
 */
function payPageLine(l: CheckoutLine): { name: string; unitAmount: number; quantity: number } {
  if (Number.isInteger(l.qty)) return { name: l.name, unitAmount: l.unitPriceMinor, quantity: l.qty };
  return { name: `${l.name}, ${formatQty(l.qty, l.saleUnit)}`, unitAmount: lineAmountMinor(l.qty, l.unitPriceMinor), quantity: 1 };
}

export function checkoutIdempotencyKey(saleId: string): string {
  return `ohm-sale-${saleId}-checkout`;
}

export function saleMetadata(saleId: string, spaceId: string): Record<string, string> {
  return { saleId, spaceId };
}

export function checkoutParams(input: {
  saleId: string;
  spaceId: string;
  currency: string;
  lines: CheckoutLine[];
  appBaseUrl: string;
  buyerEmail?: string | null;
  description: string;
  /** Unix seconds on the processor's clock (real time, not the app's test clock). */
  nowSeconds: number;
}): Stripe.Checkout.SessionCreateParams {
  const done = `${input.appBaseUrl.replace(/\/$/, '')}/counter/done?sale=${encodeURIComponent(input.saleId)}`;
  const metadata = saleMetadata(input.saleId, input.spaceId);
  return {
    mode: 'payment',
    line_items: input.lines.map(payPageLine).map((l) => ({
      price_data: {
        currency: input.currency.toLowerCase(),
        unit_amount: l.unitAmount,
        product_data: { name: l.name.slice(0, 250) },
      },
      quantity: l.quantity,
    })),
    success_url: done,
    cancel_url: `${done}&cancelled=1`,
    client_reference_id: input.saleId,
    metadata,
    payment_intent_data: { description: input.description.slice(0, 1000), metadata },
    ...(input.buyerEmail ? { customer_email: input.buyerEmail } : {}),
    expires_at: input.nowSeconds + CHECKOUT_TTL_SECONDS,
  };
}
