// Runs the payments fake as a process: `npx tsx fakes/payments/main.ts`.
// Env: PAYMENTS_FAKE_PORT (12111), PAYMENTS_FAKE_HOST (127.0.0.1), PAYMENTS_WEBHOOK_URL,
// PAYMENTS_WEBHOOK_SECRET (whsec_…), PAYMENTS_FAKE_STATE (state file), PAYMENTS_PUBLIC_URL (pay-page links),
// PAYMENTS_FAKE_CHAOS (e.g. "duplicate=3,shuffle").
import { startPaymentsFake } from './server';

function chaosFromEnv(text: string | undefined) {
  if (!text) return undefined;
  const parts = new Map<string, string | undefined>(
    text.split(',').map((p): [string, string | undefined] => {
      const [key, value] = p.trim().split('=');
      return [key, value];
    }),
  );
  return {
    duplicate: Number(parts.get('duplicate') ?? 1),
    shuffle: parts.has('shuffle') && parts.get('shuffle') !== 'false',
  };
}

async function main() {
  const secret = process.env.PAYMENTS_WEBHOOK_SECRET;
  if (!secret)
    throw new Error('PAYMENTS_WEBHOOK_SECRET is not set (the webhook signing secret, e.g. whsec_demo_...)');
  const port = Number(process.env.PAYMENTS_FAKE_PORT ?? 12111);
  if (!Number.isInteger(port) || port < 0 || port > 65535)
    throw new Error(`PAYMENTS_FAKE_PORT is not a port number: ${process.env.PAYMENTS_FAKE_PORT}`);
  const fake = await startPaymentsFake({
    port,
    host: process.env.PAYMENTS_FAKE_HOST ?? '127.0.0.1',
    webhookUrl: process.env.PAYMENTS_WEBHOOK_URL || null,
    webhookSecret: secret,
    stateFile: process.env.PAYMENTS_FAKE_STATE || undefined,
    publicUrl: process.env.PAYMENTS_PUBLIC_URL || undefined,
    chaos: chaosFromEnv(process.env.PAYMENTS_FAKE_CHAOS),
  });
  console.log(
    `payments fake listening on ${fake.url} (webhooks → ${process.env.PAYMENTS_WEBHOOK_URL || 'none'})`,
  );
  const stop = () => {
    fake.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(`payments fake: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
