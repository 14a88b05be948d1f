import http from 'node:http';
import type { Db } from '@/db/connect';
import type { Role } from '@/db/types';
import { newToken } from '@/lib/auth/tokens';
import { extractLinks } from '@/lib/mail/links';
import { waitForMessage } from '@/lib/mail/mailbox';
import { makeSpace, makeUser, uniq } from '../helpers/db';
import { BASE, signedIn, type HttpSession } from '../helpers/http';

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

/**
 * A browser-like session that connects from a chosen loopback address (127.0.0.2, 127.0.0.3 …), so the
 * app sees a different source address, as it would for another network. Uses node:http because fetch
 * cannot bind a local address.
 */
export class SourceSession {
  private cookies = new Map<string, string>();
  constructor(readonly localAddress: string) {}
  /** Extra headers on every request (e.g. a forged X-Forwarded-For). */
  headers: Record<string, string> = {};

  request(method: string, path: string, body?: string, contentType?: string): Promise<{ status: number; text: string }> {
    const url = new URL(path, BASE);
    const headers: Record<string, string> = { ...this.headers };
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (contentType) headers['content-type'] = contentType;
    // As a browser on the app's own pages would: changes carried by a session cookie must name our origin.
    if (method !== 'GET' && method !== 'HEAD') headers.origin = new URL(BASE).origin;
    return new Promise((resolve, reject) => {
      const req = http.request(
        { host: url.hostname, port: url.port, path: url.pathname + url.search, method, headers, localAddress: this.localAddress },
        (res) => {
          for (const c of res.headers['set-cookie'] ?? []) {
            const [pair] = c.split(';');
            const i = pair.indexOf('=');
            const value = pair.slice(i + 1).trim();
            if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(c)) this.cookies.delete(pair.slice(0, i).trim());
            else this.cookies.set(pair.slice(0, i).trim(), value);
          }
          let text = '';
          res.setEncoding('utf8');
          res.on('data', (d: string) => (text += d));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
        },
      );
      req.on('error', reject);
      req.end(body);
    });
  }

  /** One password attempt: the HTTP status and next-auth's `error` (null when signed in). */
  async attempt(email: string, password: string): Promise<{ status: number; error: string | null }> {
    const csrf = JSON.parse((await this.request('GET', '/api/auth/csrf')).text) as { csrfToken: string };
    const res = await this.request(
      'POST',
      '/api/auth/callback/password',
      new URLSearchParams({ csrfToken: csrf.csrfToken, email, password, json: 'true' }).toString(),
      'application/x-www-form-urlencoded',
    );
    const { url } = JSON.parse(res.text) as { url: string };
    return { status: res.status, error: new URL(url, BASE).searchParams.get('error') };
  }
}
