import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashToken } from '@/lib/auth/tokens';
import { closeTestDb, makeSpace, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { BASE, HttpSession } from '../helpers/http';
import { errorOf, tokenFromMail, type TestUser } from './auth-fixtures';

// Sign-in through next-auth's real credentials callbacks over HTTP, against the production build and
// the real PostgreSQL of the test run. Each test makes its own people, so the per-e-mail rate limit
// of one test never touches another.

const db = testDb();
let spaceId: string;
const person = (roles: Parameters<typeof makeUser>[2] = ['member']) => makeUser(db, spaceId, roles);

/** The JSON answer of the credentials callback: { url } carrying `error=...` when refused. */
async function attempt(
  s: HttpSession,
  user: Pick<TestUser, 'email'>,
  password: string,
): Promise<{ status: number; error: string | null }> {
  const res = await s.signIn(user.email, password);
  const { url } = (await res.json()) as { url: string };
  return { status: res.status, error: new URL(url, BASE).searchParams.get('error') };
}

beforeAll(async () => {
  spaceId = (await makeSpace(db)).id;
});
afterAll(closeTestDb);

describe('password sign-in', () => {
  test('the right password opens a session for that person', async () => {
    const user = await person();
    const s = new HttpSession();
    const r = await attempt(s, user, TEST_PASSWORD);
    expect(r).toEqual({ status: 200, error: null });
    const session = (await (await s.get('/api/auth/session')).json()) as { user?: { email?: string } };
    expect(session.user?.email).toBe(user.email);
  });

  test('a wrong password opens no session', async () => {
    const user = await person();
    const s = new HttpSession();
    expect(await attempt(s, user, `${TEST_PASSWORD}x`)).toEqual({ status: 401, error: 'CredentialsSignin' });
    expect(await s.isSignedIn()).toBe(false);
  });

  test('an unknown e-mail gets the same answer as a wrong password', async () => {
    const s = new HttpSession();
    expect(await attempt(s, { email: 'nobody-here@tests.example' }, TEST_PASSWORD)).toEqual({
      status: 401,
      error: 'CredentialsSignin',
    });
    expect(await s.isSignedIn()).toBe(false);
  });

  test('the e-mail matches whatever its capitals', async () => {
    const user = await person();
    const s = new HttpSession();
    expect(await attempt(s, { email: user.email.toUpperCase() }, TEST_PASSWORD)).toEqual({
      status: 200,
      error: null,
    });
    expect(await s.isSignedIn()).toBe(true);
  });
});

describe('throttling (more in auth-throttle.test.ts)', () => {
  test('after 6 wrong passwords from one address the next attempt there must wait, even with the right password', async () => {
    const user = await person();
    const s = new HttpSession();
    for (let i = 1; i <= 6; i++) {
      expect(await attempt(s, user, `wrong-password-${i}`), `attempt ${i}`).toEqual({
        status: 401,
        error: 'CredentialsSignin',
      });
    }
    expect(await attempt(s, user, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
    expect(await s.isSignedIn()).toBe(false);

    // The wait is per e-mail and address: someone else signs in as usual meanwhile.
    const other = await person();
    const o = new HttpSession();
    expect(await attempt(o, other, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });
});

describe('accounts switched off by an operator (users.disabled_at)', () => {
  test('a disabled person cannot sign in with the right password', async () => {
    const user = await person();
    await db.updateTable('users').set({ disabled_at: new Date() }).where('id', '=', user.id).execute();
    const s = new HttpSession();
    expect(await attempt(s, user, TEST_PASSWORD)).toEqual({ status: 401, error: 'CredentialsSignin' });
    expect(await s.isSignedIn()).toBe(false);
  });

  test('disabling ends a session that was already open (the guard reads disabled_at on every request)', async () => {
    const admin = await person(['admin']);
    const s = new HttpSession();
    await attempt(s, admin, TEST_PASSWORD);
    expect((await s.get('/api/settings')).status).toBe(200);
    await db.updateTable('users').set({ disabled_at: new Date() }).where('id', '=', admin.id).execute();
    const res = await s.get('/api/settings');
    expect(res.status).toBe(401);
    expect((await errorOf(res)).code).toBe('unauthenticated');
  });
});

describe('sign-in link by e-mail', () => {
  test('the link arrives at the SMTP sink and signs in once only', async () => {
    const user = await person();
    const asked = await new HttpSession().post('/api/sign-in-link', { email: user.email });
    expect(asked.status).toBe(200);

    const { token, link } = await tokenFromMail(user.email, '/signin/link');
    expect(link.origin).toBe(new URL(BASE).origin);
    // Only the token's hash is stored: the database alone cannot sign anyone in.
    const stored = await db
      .selectFrom('sign_in_tokens')
      .select('token_hash')
      .where('user_id', '=', user.id)
      .execute();
    expect(stored.map((r) => r.token_hash)).toEqual([hashToken(token)]);
    expect(stored.map((r) => r.token_hash)).not.toContain(token);

    const first = new HttpSession();
    expect((await first.signInWithLink(token)).status).toBe(200);
    const session = (await (await first.get('/api/auth/session')).json()) as { user?: { email?: string } };
    expect(session.user?.email).toBe(user.email);

    const second = new HttpSession();
    expect((await second.signInWithLink(token)).status).toBe(401);
    expect(await second.isSignedIn()).toBe(false);
  });

  test('a made-up token signs nobody in', async () => {
    const s = new HttpSession();
    expect((await s.signInWithLink('A'.repeat(43))).status).toBe(401);
    expect(await s.isSignedIn()).toBe(false);
  });

  test('asking needs a valid e-mail address (400 naming the field)', async () => {
    const res = await new HttpSession().post('/api/sign-in-link', { email: 'not-an-address' });
    expect(res.status).toBe(400);
    expect(Object.keys((await errorOf(res)).fields ?? {})).toEqual(['email']);
  });
});
