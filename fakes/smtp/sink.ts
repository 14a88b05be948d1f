import { randomUUID } from 'node:crypto';
import type { AddressInfo, Server } from 'node:net';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { StoredMessage } from '../../lib/mail/message';
import { MessageStore } from './store';
import { createMailboxApi } from './http-api';

// A local stand-in for an outgoing mail service: accepts any message without authentication,
// keeps it, and shows it through a JSON API. Dev and tests only; it listens on loopback.

export type SmtpSinkOptions = {
  smtpPort: number; // 0 picks a free port
  httpPort: number; // 0 picks a free port
  host?: string; // default 127.0.0.1
  storeFile?: string | null; // JSON file that survives restarts; omit to keep messages in memory only
  log?: (line: string) => void; // default console.log
};

export type SmtpSink = {
  host: string;
  smtpPort: number;
  httpPort: number;
  /** Base URL of the JSON API, e.g. http://127.0.0.1:2580 */
  url: string;
  store: MessageStore;
  close(): Promise<void>;
};

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

export async function startSmtpSink(options: SmtpSinkOptions): Promise<SmtpSink> {
  const host = options.host ?? '127.0.0.1';
  const log = options.log ?? ((line: string) => console.log(line));
  const store = new MessageStore(options.storeFile ?? null, log);
  await store.load();

  const smtp = new SMTPServer({
    authOptional: true,
    // Any credentials are welcome, over plain text, so a transport configured with a user still works.
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anyone' }),
    disabledCommands: ['STARTTLS'],
    disableReverseLookup: true, // a DNS lookup per connection only slows tests down
    logger: false,
    size: MAX_MESSAGE_BYTES,
    closeTimeout: 500, // pooled clients keep idle connections; do not wait 30 s for them on shutdown
    banner: 'Ohmstead local mail sink',
    onData(stream, session, callback) {
      receive(stream, session, store)
        .then((message) => {
          log(
            `smtp sink: ${message.receivedAt} ${message.from} -> ${message.to.join(', ')} "${message.subject}" (${message.id})`,
          );
          callback(null, `Kept as ${message.id}`);
        })
        .catch((err: Error) => callback(err));
    },
  });
  // Client resets and the like arrive here; a dev sink logs them and carries on.
  smtp.on('error', (err) => log(`smtp sink: ${err.message}`));

  const api = createMailboxApi(store);
  const smtpPort = await listen(smtp.server, options.smtpPort, host);
  let httpPort: number;
  try {
    httpPort = await listen(api, options.httpPort, host);
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }

  return {
    host,
    smtpPort,
    httpPort,
    url: `http://${host}:${httpPort}`,
    store,
    async close() {
      api.closeAllConnections();
      await Promise.all([
        new Promise<void>((resolve) => smtp.close(() => resolve())),
        new Promise<void>((resolve) => api.close(() => resolve())),
      ]);
      await store.flushed();
    },
  };
}

async function receive(
  stream: SMTPServerDataStream,
  session: SMTPServerSession,
  store: MessageStore,
): Promise<StoredMessage> {
  const parsed = await simpleParser(stream);
  if (stream.sizeExceeded) {
    throw Object.assign(new Error(`Message is larger than ${MAX_MESSAGE_BYTES} bytes`), {
      responseCode: 552,
    });
  }
  const envelope = session.envelope;
  const envelopeFrom = envelope.mailFrom ? envelope.mailFrom.address : '';
  const message: StoredMessage = {
    id: randomUUID(),
    receivedAt: new Date().toISOString(),
    from: parsed.from?.text || envelopeFrom,
    // The envelope recipients are who the message was delivered to (Bcc included), like a real mailbox.
    to: envelope.rcptTo.map((r) => r.address),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
    messageId: parsed.messageId ?? null,
    attachments: parsed.attachments.map((a) => ({
      filename: a.filename ?? 'attachment',
      contentType: a.contentType,
      size: a.size,
      text: /^text\//.test(a.contentType) ? a.content.toString('utf8') : null,
    })),
  };
  await store.add(message);
  return message;
}

function listen(server: Server, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (err: Error) => reject(err);
    server.once('error', onError);
    server.listen(port, host, () => {
      server.off('error', onError);
      resolve((server.address() as AddressInfo).port);
    });
  });
}
