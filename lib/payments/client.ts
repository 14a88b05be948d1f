import 'server-only';
import type Stripe from 'stripe';
import { env } from '@/lib/env';
import { UnavailableError } from '@/lib/errors';
import type { PaymentsDeps } from '@/lib/sales/card';
import { makeStripe } from './stripe';

// The app's processor client. One SDK client per port, kept for the life of the process.
// Tests (OHM_TEST_HOOKS=1 only) may point one space at another payments endpoint, so a test can run
// its own fake, or a closed port, without touching the sales of any other space.
const g = globalThis as typeof globalThis & {
  ohmPaymentsPorts?: Map<string, number>;
  ohmStripeClients?: Map<number, Stripe>;
};

export function setTestPaymentsPort(spaceId: string, port: number | null): void {
  if (env().OHM_TEST_HOOKS !== '1') throw new Error('payments endpoint overrides are only for tests');
  const ports = (g.ohmPaymentsPorts ??= new Map());
  if (port === null) ports.delete(spaceId);
  else ports.set(spaceId, port);
}

export function paymentsClient(spaceId?: string): Stripe {
  const e = env();
  if (!e.STRIPE_SECRET_KEY) throw new UnavailableError('Card payments are not configured here (no STRIPE_SECRET_KEY).');
  const override =
    e.OHM_TEST_HOOKS === '1' && spaceId ? g.ohmPaymentsPorts?.get(spaceId) : undefined;
  const port = override ?? e.PAYMENTS_API_PORT;
  const clients = (g.ohmStripeClients ??= new Map());
  let client = clients.get(port);
  if (!client) {
    client = makeStripe({
      STRIPE_SECRET_KEY: e.STRIPE_SECRET_KEY,
      PAYMENTS_API_HOST: e.PAYMENTS_API_HOST,
      PAYMENTS_API_PORT: port,
      PAYMENTS_API_PROTOCOL: e.PAYMENTS_API_PROTOCOL,
      PAYMENTS_API_TIMEOUT_MS: e.PAYMENTS_API_TIMEOUT_MS,
    });
    clients.set(port, client);
  }
  return client;
}

export function paymentsDeps(spaceId: string): PaymentsDeps {
  return { stripe: paymentsClient(spaceId), appBaseUrl: env().APP_BASE_URL };
}

/** The webhook signing secret, or undefined when none is configured (then every event is refused). */
export function webhookSecret(): string | undefined {
  return env().STRIPE_WEBHOOK_SECRET;
}
