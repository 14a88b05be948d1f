// The processor's SDK client, pointed by env at the local payments fake (or at the real API:
// PAYMENTS_API_HOST=api.stripe.com, PAYMENTS_API_PORT=443, PAYMENTS_API_PROTOCOL=https).
// Deliberately without `import 'server-only'`: integration tests import it directly.
import Stripe from 'stripe';
import { z } from 'zod';

const stripeEnvSchema = z.object({
  STRIPE_SECRET_KEY: z.string().min(1, 'set STRIPE_SECRET_KEY (sk_test_… for the payments fake)'),
  PAYMENTS_API_HOST: z.string().min(1, 'set PAYMENTS_API_HOST (127.0.0.1 for the payments fake)'),
  PAYMENTS_API_PORT: z.coerce.number().int().min(1).max(65535),
  PAYMENTS_API_PROTOCOL: z.enum(['http', 'https']),
  PAYMENTS_API_TIMEOUT_MS: z.coerce.number().int().min(100).max(80_000).default(5_000),
});

export type StripeEnv = z.input<typeof stripeEnvSchema>;

/**
 * One SDK client per call; callers keep it. One network retry (the SDK sends an idempotency key with
 * every POST, so the retry cannot charge twice) and a short timeout, so a dead payments service turns
 * into a StripeConnectionError within seconds instead of a hanging request.
 */
export function makeStripe(env: StripeEnv): Stripe {
  const parsed = stripeEnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`Payments client is misconfigured: ${lines}`);
  }
  const e = parsed.data;
  return new Stripe(e.STRIPE_SECRET_KEY, {
    host: e.PAYMENTS_API_HOST,
    port: e.PAYMENTS_API_PORT,
    protocol: e.PAYMENTS_API_PROTOCOL,
    maxNetworkRetries: 1,
    timeout: e.PAYMENTS_API_TIMEOUT_MS,
    appInfo: { name: 'ohmstead' },
  });
}
