import type { Db } from '@/db/connect';
import type { Role } from '@/db/types';
import { newToken } from '@/lib/auth/tokens';
import { extractLinks } from '@/lib/mail/links';
import { waitForMessage } from '@/lib/mail/mailbox';
import { makeSpace, makeUser, uniq } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// Shared set-up for the auth-* and people-* integration files (not a test file itself).

export type TestUser = Awaited<ReturnType<typeof makeUser>>;

/** A fresh space with one person per role, so no test depends on the demo data or another file. */
export async function staffedSpace(db: Db, name?: string) {
  const space = await makeSpace(db, name ? { name } : {});
  const people: Record<Role, TestUser> = {
    admin: await makeUser(db, space.id, ['admin'], 'Test admin'),
    steward: await makeUser(db, space.id, ['steward'], 'Test steward'),
    treasurer: await makeUser(db, space.id, ['treasurer'], 'Test treasurer'),
    member: await makeUser(db, space.id, ['member'], 'Test member'),
  };
  return { space, people };
}

export const session = (user: TestUser): Promise<HttpSession> => signedIn(user.email, user.password);

/** The error body every route answers with: { error: { code, message, fields? } }. */
export async function errorOf(
  res: Response,
): Promise<{ code: string; message: string; fields?: Record<string, string[]> }> {
  const body = (await res.json()) as {
    error: { code: string; message: string; fields?: Record<string, string[]> };
  };
  return body.error;
}

/** An open invitation written straight into the database (for tenancy and guard checks). */
export async function openInvitation(db: Db, spaceId: string, roles: Role[] = ['member']) {
  const { token, hash } = newToken();
  const row = await db
    .insertInto('invitations')
    .values({
      space_id: spaceId,
      email: `${uniq('invitee')}@tests.example`,
      name: 'Invited person',
      roles,
      token_hash: hash,
      expires_at: new Date(Date.now() + 86_400_000),
    })
    .returning(['id', 'email'])
    .executeTakeFirstOrThrow();
  return { ...row, token };
}

/** Waits for a message to `to` at the SMTP sink and returns the token of its link to `pathname`. */
export async function tokenFromMail(
  to: string,
  pathname: string,
  match?: (text: string) => boolean,
): Promise<{ token: string; link: URL }> {
  const message = await waitForMessage({ to, timeoutMs: 15_000, match: (m) => !match || match(m.text) });
  const link = extractLinks(message)
    .map((l) => new URL(l))
    .find((u) => u.pathname === pathname && u.searchParams.get('token'));
  if (!link) throw new Error(`no ${pathname} link in the message to ${to}: ${message.text}`);
  return { token: link.searchParams.get('token')!, link };
}
