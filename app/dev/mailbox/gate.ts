import 'server-only';
import { connection } from 'next/server';
import { headers } from 'next/headers';
import { notFound } from 'next/navigation';
import { env } from '@/lib/env';
import { UnavailableError } from '@/lib/errors';

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|localhost|\[::1\]|::1)(:\d+)?$/i;

/** True when the request was addressed to this machine itself and did not come through a proxy. */
export function fromThisMachine(h: Pick<Headers, 'get'>): boolean {
  if (!LOOPBACK.test(h.get('host') ?? '')) return false;
  const forwarded = [h.get('x-forwarded-for'), h.get('forwarded'), h.get('x-real-ip')].filter(Boolean);
  return forwarded.every((v) => v!.split(',').every((ip) => LOOPBACK.test(ip.trim().replace(/^for=/i, ''))));
}

/**
 * The dev mailbox shows sign-in links, so it is held shut three ways: its pages (page.devonly.tsx) are
 * compiled only into test and dev builds, never the one `npm start` serves; it answers only where
 * OHM_DEV_MAILBOX=1; and only to a request addressed to this machine (a loopback Host, no proxy hops).
 * Otherwise it is a 404 like any missing page. `connection()` makes the check run per request.
 */
export async function requireDevMailbox(): Promise<void> {
  await connection();
  if (env().OHM_DEV_MAILBOX !== '1') notFound();
  if (!fromThisMachine(await headers())) notFound();
}

/** Runs a mailbox read; a stopped sink becomes a message for the page instead of an error screen. */
export async function readMailbox<T>(read: () => Promise<T>): Promise<{ data: T } | { down: string }> {
  try {
    return { data: await read() };
  } catch (err) {
    if (err instanceof UnavailableError) return { down: err.message };
    throw err;
  }
}
