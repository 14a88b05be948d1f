import { after } from 'next/server';
import Stripe from 'stripe';
import { z } from 'zod';
import { db } from '@/db';
import { InvalidError } from '@/lib/errors';
import { rawText, route } from '@/lib/http/route';
import { afterPaymentEvent } from '@/lib/payments/after-event';
import { webhookSecret } from '@/lib/payments/client';
import { applyPaymentEvent } from '@/lib/payments/events';

export const dynamic = 'force-dynamic';

// The signature is the authentication: the raw body is verified against the signing secret before
// anything is read from it; a bad or stale signature (older than the SDK's 5-minute tolerance) is a 400
// with nothing applied. Without a configured secret every event is refused.
function verified(raw: string, header: string | null): Stripe.Event {
  if (!header) throw new InvalidError('Missing the Stripe-Signature header.', { 'stripe-signature': ['required'] });
  const secret = webhookSecret();
  if (!secret)
    throw new InvalidError('Payments are not configured here: no webhook signing secret.', {
      'stripe-signature': ['no signing secret is configured; every event is refused'],
    });
  try {
    return Stripe.webhooks.constructEvent(raw, header, secret);
  } catch (err) {
    const why = err instanceof Error ? err.message : 'signature check failed';
    throw new InvalidError('The webhook signature does not verify.', {
      'stripe-signature': [why.split('\n')[0].slice(0, 200)],
    });
  }
}

export const POST = route({
  method: 'POST',
  summary: 'The payment processor’s signed webhook (Stripe-Signature); each event is applied once',
  who: 'signature',
  body: rawText('application/json'),
  response: z.object({ received: z.literal(true), id: z.string(), outcome: z.string() }),
  run: async ({ req, body }) => {
    const event = verified(body, req.headers.get('stripe-signature'));
    const result = await applyPaymentEvent(db, event);
    // After the answer: the processor waits only a few seconds for it, and mail can be slower.
    after(() => afterPaymentEvent(db, result));
    return { received: true, id: event.id, outcome: result.outcome };
  },
});
