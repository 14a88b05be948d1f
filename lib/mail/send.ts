import nodemailer, { type Transporter } from 'nodemailer';
import { z } from 'zod';
import { rawEnv } from '@/lib/env';
import { AppError, InvalidError, UnavailableError } from '@/lib/errors';
import { zodFields } from '@/lib/http/respond';

// Outgoing mail over plain SMTP. In dev, the demo and the tests that is the local sink (fakes/smtp);
// a deployment points SMTP_HOST / SMTP_PORT at its relay. No `server-only` here so tests can import it;
// app code imports lib/mail/server.ts, which adds it.

export type MailConfig = { host: string; port: number; from: string; user?: string; password?: string; tls?: 'none' | 'starttls' | 'implicit' };

const portSchema = z.coerce.number().int().min(1).max(65535);

/** Reads the mail settings from the environment at call time (tests may set them after import). */
export function mailConfigFromEnv(env: Record<string, string | undefined> = rawEnv()): MailConfig {
  const port = portSchema.safeParse(env.SMTP_PORT || 2525);
  if (!port.success) throw new Error(`SMTP_PORT must be a port number (1-65535), got "${env.SMTP_PORT}"`);
  return {
    host: env.SMTP_HOST || '127.0.0.1',
    port: port.data,
    from: env.MAIL_FROM || 'Ohmstead <bench@ohmstead.invalid>',
    user: env.SMTP_USER || undefined,
    password: env.SMTP_PASSWORD || undefined,
    tls: env.SMTP_TLS === 'starttls' || env.SMTP_TLS === 'implicit' ? env.SMTP_TLS : 'none',
  };
}

export const outgoingMailSchema = z.object({
  to: z.union([z.email(), z.array(z.email()).min(1)]),
  subject: z.string().trim().min(1).max(900),
  text: z.string(),
  html: z.string().optional(),
  /** Small text files sent with the message (an order list's CSV). */
  attachments: z
    .array(
      z.object({
        filename: z.string().min(1).max(200),
        contentType: z.string().min(1).max(100),
        content: z.string().max(1_000_000),
      }),
    )
    .max(5)
    .optional(),
});
export type OutgoingMail = z.input<typeof outgoingMailSchema>;
export type SentMail = { messageId: string; accepted: string[] };

// Short limits: a sign-in request should fail in seconds, not hang, when mail is down.
const TIMEOUTS = { connectionTimeout: 3_000, greetingTimeout: 3_000, socketTimeout: 10_000 };

// One pooled transport per host:port, kept on globalThis so dev hot reload does not open new pools.
const cache = globalThis as typeof globalThis & { __ohmsteadMailTransports?: Map<string, Transporter> };

function transportFor(config: MailConfig): Transporter {
  const transports = (cache.__ohmsteadMailTransports ??= new Map());
  const key = `${config.host}:${config.port}:${config.tls ?? 'none'}:${config.user ?? ''}`;
  let transport = transports.get(key);
  if (!transport) {
    transport = nodemailer.createTransport({
      pool: true,
      maxConnections: 2,
      host: config.host,
      port: config.port,
      // The local sink speaks plain SMTP; a real relay takes STARTTLS (587) or TLS from the start (465).
      secure: config.tls === 'implicit',
      ignoreTLS: (config.tls ?? 'none') === 'none',
      requireTLS: config.tls === 'starttls',
      auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
      ...TIMEOUTS,
    });
    transports.set(key, transport);
  }
  return transport;
}

/** Sends one message. Throws InvalidError (fields named) for bad input, UnavailableError when mail is down. */
export async function sendMail(
  mail: OutgoingMail,
  config: MailConfig = mailConfigFromEnv(),
): Promise<SentMail> {
  const parsed = outgoingMailSchema.safeParse(mail);
  if (!parsed.success) throw new InvalidError('Check the message.', zodFields(parsed.error));
  const { to, subject, text, html, attachments } = parsed.data;
  try {
    const info = await transportFor(config).sendMail({ from: config.from, to, subject, text, html, attachments });
    return {
      messageId: String(info.messageId),
      accepted: (info.accepted as Array<string | { address: string }>).map((a) =>
        typeof a === 'string' ? a : a.address,
      ),
    };
  } catch (err) {
    throw toAppError(err, config);
  }
}

// Connection-level failures, plus SMTP 421 "service not available" (RFC 5321 §4.2.3).
const UNREACHABLE_CODES = new Set([
  'ECONNECTION',
  'ETIMEDOUT',
  'ESOCKET',
  'EDNS',
  'ECONNREFUSED',
  'ECONNRESET',
]);

function toAppError(err: unknown, config: MailConfig): Error {
  const e = err as { code?: string; responseCode?: number; message?: string } | null;
  if (e && ((e.code && UNREACHABLE_CODES.has(e.code)) || e.responseCode === 421)) {
    return new UnavailableError(
      `Mail could not be sent: the mail server at ${config.host}:${config.port} is unreachable.`,
    );
  }
  if (e?.code === 'EENVELOPE') {
    return new InvalidError('The mail server refused a recipient.', { to: [e.message ?? 'refused'] });
  }
  return err instanceof AppError || err instanceof Error ? err : new Error(String(err));
}

/** Closes every pooled connection (test teardown, graceful shutdown). */
export function closeMailTransports(): void {
  const transports = cache.__ohmsteadMailTransports;
  if (!transports) return;
  for (const t of transports.values()) t.close();
  transports.clear();
}

/** Whether the mail server answers and (with SMTP_USER) accepts our sign-in: a health check's probe. */
export async function mailReachable(config: MailConfig = mailConfigFromEnv()): Promise<boolean> {
  try {
    await transportFor(config).verify();
    return true;
  } catch {
    return false;
  }
}
