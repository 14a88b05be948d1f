import 'server-only';
import { connection } from 'next/server';
import { notFound } from 'next/navigation';
import { UnavailableError } from '@/lib/errors';

/**
 * The dev mailbox exists only where OHM_DEV_MAILBOX=1 (the demo start script sets it; deployments leave it
 * off), and then it answers 404 like any missing page. `connection()` makes the check run per request,
 * never once at build time.
 */
export async function requireDevMailbox(): Promise<void> {
  await connection();
  if (process.env.OHM_DEV_MAILBOX !== '1') notFound();
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
