import { z } from 'zod';
import { rawEnv } from '@/lib/env';
import { NotFoundError, UnavailableError } from '@/lib/errors';
import { storedMessageSchema, type StoredMessage } from './message';

// Reads the local SMTP sink's JSON API (fakes/smtp). Used by the dev mailbox page and by tests
// that need to open a link someone was sent. No `server-only` here so tests can import it.

export type { StoredMessage };

/** Base URL of the sink's API, read at call time. */
export function mailboxUrl(env: Record<string, string | undefined> = rawEnv()): string {
  return (env.MAILBOX_URL || 'http://127.0.0.1:2580').replace(/\/+$/, '');
}

const listSchema = z.object({ messages: z.array(storedMessageSchema) });

async function callSink(path: string, init?: RequestInit): Promise<Response> {
  const url = `${mailboxUrl()}${path}`;
  let res: Response;
  try {
    res = await fetch(url, { ...init, cache: 'no-store', signal: AbortSignal.timeout(3_000) });
  } catch {
    throw new UnavailableError(
      `The local mailbox at ${mailboxUrl()} is not answering; is the SMTP sink running?`,
    );
  }
  if (!res.ok && res.status !== 404) {
    throw new UnavailableError(`The local mailbox answered ${res.status} for ${path}.`);
  }
  return res;
}

/** Messages the sink holds, newest first; `to` keeps only those delivered to that address. */
export async function listMessages(options: { to?: string } = {}): Promise<StoredMessage[]> {
  const query = options.to ? `?to=${encodeURIComponent(options.to)}` : '';
  const res = await callSink(`/messages${query}`);
  return listSchema.parse(await res.json()).messages;
}

/** One message, or null when the sink has no message with that id. */
export async function getMessage(id: string): Promise<StoredMessage | null> {
  const res = await callSink(`/messages/${encodeURIComponent(id)}`);
  if (res.status === 404) return null;
  return storedMessageSchema.parse(await res.json());
}

/** Empties the mailbox. */
export async function clearMessages(): Promise<void> {
  await callSink('/messages', { method: 'DELETE' });
}

/**
 * Waits until a message for `to` arrives that `match` accepts (for tests: "the sign-in mail came").
 * Throws NotFoundError after `timeoutMs`.
 */
export async function waitForMessage(options: {
  to: string;
  match?: (message: StoredMessage) => boolean;
  timeoutMs?: number;
}): Promise<StoredMessage> {
  const deadline = Date.now() + (options.timeoutMs ?? 5_000);
  for (;;) {
    const found = (await listMessages({ to: options.to })).find((m) => !options.match || options.match(m));
    if (found) return found;
    if (Date.now() > deadline)
      throw new NotFoundError(`No matching message for ${options.to} arrived in time.`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}
