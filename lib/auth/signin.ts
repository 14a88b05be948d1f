import 'server-only';
import { sql, type ExpressionBuilder } from 'kysely';
import type { Db } from '@/db/connect';
import type { Database } from '@/db/types';
import { hashPassword, verifyPassword } from './password';
import { hashToken, newToken } from './tokens';
import { audit } from '@/lib/audit/log';
import { sendSignInLink } from '@/lib/mail/templates';
import { log } from '@/lib/log';

let dummyHash: string | undefined;

/** The account is on and has at least one space whose admins have not switched its access off. */
// across spaces: before sign-in there is no space; any space where access is on lets the person in.
const mayEnter = (eb: ExpressionBuilder<Database, 'users'>) =>
  eb.and([
    eb('users.disabled_at', 'is', null),
    eb.exists(
      eb
        .selectFrom('memberships')
        .select('memberships.user_id')
        .whereRef('memberships.user_id', '=', 'users.id')
        .where('memberships.disabled_at', 'is', null),
    ),
  ]);

export type SignedIn = { id: string; email: string; name: string };

/** Checks e-mail and password; null for a wrong pair or an account with no way in (same answer for both). */
export async function checkPassword(db: Db, email: string, password: string): Promise<SignedIn | null> {
  const user = await db
    .selectFrom('users')
    .select((eb) => ['id', 'email', 'name', 'password_hash', mayEnter(eb).as('may_enter')])
    .where('email', '=', email.trim())
    .executeTakeFirst();
  // Compare against a fixed hash when the user is unknown, so timing does not reveal who exists.
  const hash = user?.password_hash ?? (dummyHash ??= await hashPassword('no such account'));
  const ok = await verifyPassword(password, hash);
  if (!user || !ok || !user.may_enter || !user.password_hash) return null;
  return { id: user.id, email: user.email, name: user.name };
}

/** Creates a one-time sign-in link token (valid 15 minutes) for an active user; null if none. */
export async function createSignInToken(db: Db, email: string): Promise<{ token: string; user: SignedIn } | null> {
  const user = await db
    .selectFrom('users')
    .select(['id', 'email', 'name'])
    .where('email', '=', email.trim())
    .where(mayEnter)
    .executeTakeFirst();
  if (!user) return null;
  const { token, hash } = newToken();
  await db
    .insertInto('sign_in_tokens')
    .values({ user_id: user.id, token_hash: hash, expires_at: sql<Date>`now() + interval '15 minutes'` as never })
    .execute();
  return { token, user };
}

/** Uses a link token once: a single guarded update, so two clicks cannot both sign in. */
export async function consumeSignInToken(db: Db, token: string): Promise<SignedIn | null> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .updateTable('sign_in_tokens')
      .set({ used_at: sql`now()` as never })
      .where('token_hash', '=', hashToken(token))
      .where('used_at', 'is', null)
      .where('expires_at', '>', sql<Date>`now()`)
      .returning('user_id')
      .executeTakeFirst();
    if (!row) return null;
    const user = await trx
      .selectFrom('users')
      .select(['id', 'email', 'name'])
      .where('id', '=', row.user_id)
      .where(mayEnter)
      .executeTakeFirst();
    if (user) await audit(trx, { spaceId: null, actorId: user.id, action: 'auth.link_used' });
    return user ?? null;
  });
}

/**
 * Makes and mails a sign-in link if the address belongs to someone who may sign in, and does nothing
 * otherwise. Runs after the answer has gone (next/server after()), so neither the answer nor its timing
 * tells whether the address has an account; a failure is only logged.
 */
export async function mailSignInLinkIfKnown(db: Db, email: string): Promise<void> {
  try {
    const created = await db.transaction().execute((trx) => createSignInToken(trx, email));
    if (created) await sendSignInLink(created.user, created.token);
  } catch (err) {
    log.error({ err: (err as Error).message }, 'sign-in link not sent');
  }
}
