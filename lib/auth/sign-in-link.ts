import 'server-only';
import type { Db } from '@/db/connect';
import { TooManyError } from '@/lib/errors';
import { linkLimiter, take } from './rate-limit';
import { mailSignInLinkIfKnown } from './signin';

/**
 * Asks for a sign-in link by e-mail; the caller never learns whether the address has an account. Only the
 * rate limit runs before the answer; the link is made and mailed by `later` (the route passes next/server's
 * `after`), so the answer and its timing are the same for a known and an unknown address.
 */
export async function requestSignInLink(db: Db, email: string, later: (task: () => Promise<void>) => void): Promise<void> {
  if (!(await take(linkLimiter(), email))) throw new TooManyError();
  later(() => mailSignInLinkIfKnown(db, email));
}
