import 'server-only';
import type { Db } from '@/db/connect';
import { TooManyError } from '@/lib/errors';
import { sendSignInLink } from '@/lib/mail/templates';
import { linkLimiter, take } from './rate-limit';
import { createSignInToken } from './signin';

/** Asks for a sign-in link by e-mail; the caller never learns whether the address has an account. */
export async function requestSignInLink(db: Db, email: string): Promise<void> {
  if (!(await take(linkLimiter(), email))) throw new TooManyError();
  const created = await db.transaction().execute((trx) => createSignInToken(trx, email));
  if (created) await sendSignInLink(created.user, created.token);
}
