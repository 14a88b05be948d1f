import { createHmac } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';

// Finding 2: with no webhook signing secret configured, the webhook refuses every event — even one
// signed with the secret that used to be printed in the repository as a fallback.
let POST: (req: Request) => Promise<Response>;

beforeAll(async () => {
  Object.assign(process.env, {
    DATABASE_URL: 'postgres://postgres@127.0.0.1:1/none',
    NEXTAUTH_SECRET: 'unit-test-secret-long-enough',
  });
  delete process.env.STRIPE_WEBHOOK_SECRET;
  ({ POST } = await import('@/app/api/payments/webhook/route'));
});

describe('POST /api/payments/webhook without a configured secret', () => {
  it('refuses a signed event with 400 and applies nothing', async () => {
    const body = JSON.stringify({ id: 'evt_1', type: 'checkout.session.completed', data: { object: {} } });
    const t = Math.floor(Date.now() / 1000);
    for (const secret of ['whsec_ohmstead_local_dev_secret', '']) {
      const v1 = createHmac('sha256', secret).update(`${t}.${body}`).digest('hex');
      const res = await POST(
        new Request('http://127.0.0.1/api/payments/webhook', {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'stripe-signature': `t=${t},v1=${v1}` },
          body,
        }),
      );
      expect(res.status).toBe(400);
      const err = (await res.json()).error;
      expect(err.fields['stripe-signature'].join()).toMatch(/no signing secret/);
    }
  });
});
