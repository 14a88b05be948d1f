// Checkout sessions: create (mode=payment with inline price_data), expire, and expiry by the clock.
import { z } from 'zod';
import { createEvent, type Ctx } from './context';
import { invalid, missing } from './errors';
import { currency, expand, metadata, nonNegativeInt, positiveInt } from './params';
import { newId, type ApiObject } from './state';

const httpUrl = z.string().refine((s) => {
  try {
    return ['http:', 'https:'].includes(new URL(s).protocol);
  } catch {
    return false;
  }
}, 'Not a valid http(s) URL');

const lineItem = z
  .object({
    price_data: z
      .object({
        currency,
        unit_amount: nonNegativeInt.refine((n) => n <= 99_999_999, 'At most 8 digits'),
        product_data: z.object({ name: z.string().min(1).max(250) }).strict(),
      })
      .strict(),
    quantity: positiveInt,
  })
  .strict();

export const createSessionParams = z
  .object({
    mode: z.literal('payment', { error: 'Only mode=payment is supported by the payments fake' }),
    line_items: z.array(lineItem).min(1).max(100),
    success_url: httpUrl,
    cancel_url: httpUrl.optional(),
    metadata: metadata.optional(),
    client_reference_id: z.string().min(1).max(200).optional(),
    customer_email: z.email().optional(),
    expires_at: z.string().regex(/^\d+$/, 'Invalid integer').transform(Number).optional(),
    payment_intent_data: z
      .object({ description: z.string().max(1000).optional(), metadata: metadata.optional() })
      .strict()
      .optional(),
    payment_method_types: z.array(z.literal('card')).optional(),
    expand,
  })
  .strict();

export type CreateSessionParams = z.infer<typeof createSessionParams>;

// The real API accepts an expiry between 30 minutes and 24 hours from creation.
const MIN_EXPIRY_S = 30 * 60;
const MAX_EXPIRY_S = 24 * 60 * 60;

export function createSession(ctx: Ctx, p: CreateSessionParams): ApiObject {
  const cur = p.line_items[0].price_data.currency;
  p.line_items.forEach((li, i) => {
    if (li.price_data.currency !== cur) {
      throw invalid('All line items must use the same currency.', `line_items[${i}][price_data][currency]`);
    }
  });
  const created = ctx.now();
  const expiresAt = p.expires_at ?? created + MAX_EXPIRY_S;
  if (expiresAt < created + MIN_EXPIRY_S || expiresAt > created + MAX_EXPIRY_S) {
    throw invalid(
      'The `expires_at` timestamp must be between 30 minutes and 24 hours from now.',
      'expires_at',
    );
  }
  const id = newId('cs_test', 58);
  const items = p.line_items.map((li) => lineItemObject(created, li));
  const total = items.reduce((sum, li) => sum + (li.amount_total as number), 0);
  if (total <= 0) throw invalid('The total of the line items must be greater than zero.', 'line_items');
  const session: ApiObject = {
    id,
    object: 'checkout.session',
    after_expiration: null,
    allow_promotion_codes: null,
    amount_subtotal: total,
    amount_total: total,
    cancel_url: p.cancel_url ?? null,
    client_reference_id: p.client_reference_id ?? null,
    created,
    currency: cur,
    customer: null,
    customer_creation: 'if_required',
    customer_details: null,
    customer_email: p.customer_email ?? null,
    expires_at: expiresAt,
    livemode: false,
    locale: null,
    metadata: p.metadata ?? {},
    mode: 'payment',
    payment_intent: null,
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    status: 'open',
    success_url: p.success_url,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    url: `${ctx.publicUrl}/pay/${id}`,
    // Kept for the payment intent made at the first pay attempt; `_` fields never leave the fake.
    _payment_intent_data: p.payment_intent_data ?? {},
  };
  ctx.state.sessions[id] = session;
  ctx.state.lineItems[id] = items;
  return session;
}

function lineItemObject(created: number, li: CreateSessionParams['line_items'][number]): ApiObject {
  const { unit_amount, currency: cur, product_data } = li.price_data;
  const amount = unit_amount * li.quantity;
  return {
    id: newId('li'),
    object: 'item',
    amount_discount: 0,
    amount_subtotal: amount,
    amount_tax: 0,
    amount_total: amount,
    created,
    currency: cur,
    description: product_data.name,
    livemode: false,
    price: {
      id: newId('price'),
      object: 'price',
      active: false,
      billing_scheme: 'per_unit',
      created,
      currency: cur,
      livemode: false,
      metadata: {},
      product: newId('prod'),
      type: 'one_time',
      unit_amount,
      unit_amount_decimal: String(unit_amount),
    },
    quantity: li.quantity,
  };
}

export function getSession(ctx: Ctx, id: string): ApiObject {
  const session = ctx.state.sessions[id];
  if (!session) throw missing('checkout.session', id);
  return session;
}

export function expireSession(ctx: Ctx, id: string): ApiObject {
  const session = getSession(ctx, id);
  if (session.status !== 'open') {
    throw invalid(
      `Only Checkout Sessions with status "open" can be expired; this one is "${String(session.status)}".`,
      'session',
    );
  }
  session.status = 'expired';
  session.url = null;
  const pi = session.payment_intent ? ctx.state.paymentIntents[session.payment_intent as string] : undefined;
  if (pi && pi.status !== 'succeeded') {
    Object.assign(pi, { status: 'canceled', canceled_at: ctx.now(), cancellation_reason: 'abandoned' });
    createEvent(ctx, 'payment_intent.canceled', pi);
  }
  createEvent(ctx, 'checkout.session.expired', session);
  return session;
}

/** Open sessions past their `expires_at` expire, as the real processor does on its own. */
export function expireOverdueSessions(ctx: Ctx): number {
  const now = ctx.now();
  const overdue = Object.values(ctx.state.sessions).filter(
    (s) => s.status === 'open' && (s.expires_at as number) <= now,
  );
  overdue.forEach((s) => expireSession(ctx, s.id));
  return overdue.length;
}
