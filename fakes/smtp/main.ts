import path from 'node:path';
import { startSmtpSink } from './sink';

// `npx tsx fakes/smtp/main.ts` — the local SMTP sink for dev and the demo (scripts/ start it).
// SMTP_SINK_PORT (2525), SMTP_SINK_HTTP_PORT (2580), SMTP_SINK_STORE (.data/mailbox.json).

function port(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 65535) {
    console.error(`smtp sink: ${name} must be a port number (0-65535), got "${raw}"`);
    process.exit(2);
  }
  return n;
}

async function main(): Promise<void> {
  const sink = await startSmtpSink({
    smtpPort: port('SMTP_SINK_PORT', 2525),
    httpPort: port('SMTP_SINK_HTTP_PORT', 2580),
    host: '127.0.0.1',
    storeFile: path.resolve(process.env.SMTP_SINK_STORE || '.data/mailbox.json'),
  });
  console.log(
    `smtp sink: SMTP on ${sink.host}:${sink.smtpPort}, mailbox API on ${sink.url}, store ${sink.store.file}, ` +
      `${sink.store.list().length} message(s) kept`,
  );

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`smtp sink: ${signal}, stopping`);
    sink.close().then(
      () => process.exit(0),
      (err: unknown) => {
        console.error(`smtp sink: error while stopping: ${String(err)}`);
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(`smtp sink: could not start: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
