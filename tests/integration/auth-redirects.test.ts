import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { BASE, HttpSession } from '../helpers/http';
import { session, type TestUser } from './auth-fixtures';

// Where sign-in sends a person afterwards (issue 11, finding 1), and what the next-auth catch-all
// answers to junk (finding 7). Real HTTP against the production build.

const db = testDb();
let user: TestUser;
let signedInSession: HttpSession;
const origin = new URL(BASE).origin;

// `next` values as they appear in the query string (already URL-encoded where a browser would).
const HOSTILE = [
  '/%5Cevil.example', // → /\evil.example: browsers treat \ as /
  '%5Cevil.example',
  '/%5C/evil.example',
  '/%5c%5cevil.example', // lower-case escapes
  '%2F%2Fevil.example',
  '//evil.example',
  '/%2F%2Fevil.example',
  '/%252F%252Fevil.example', // encoded twice
  '/\\/evil.example',
  '/%09/evil.example', // a tab, which browsers drop: //evil.example
  '/%0A/evil.example',
  '%09//evil.example',
  'HTTPS://evil.example',
  'https:%2F%2Fevil.example',
  'javascript:alert(1)',
  'JaVaScRiPt:alert(1)',
  '/%00/evil.example',
];

beforeAll(async () => {
  const space = await makeSpace(db);
  user = await makeUser(db, space.id, ['member']);
  signedInSession = await session(user);
});
afterAll(closeTestDb);

describe('the sign-in page sends a signed-in person only to a path of this site', () => {
  test.each(HOSTILE)('next=%s goes to the home page', async (next) => {
    const res = await signedInSession.get(`/signin?next=${next}`);
    expect(res.status).toBe(307);
    const location = res.headers.get('location') ?? '';
    expect(location).toBe('/today');
    expect(new URL(location, BASE).origin).toBe(origin);
  });

  test('an ordinary path (with its query) is kept', async () => {
    const res = await signedInSession.get(`/signin?next=${encodeURIComponent('/loans?status=out')}`);
    expect(res.status).toBe(307);
    expect(res.headers.get('location')).toBe('/loans?status=out');
  });
});

describe("next-auth's callback URL stays on this site", () => {
  test.each([...HOSTILE, `${origin}/loans`])('callbackUrl=%s', async (raw) => {
    const s = new HttpSession();
    const csrf = (await (await s.get('/api/auth/csrf')).json()) as { csrfToken: string };
    const res = await s.postForm('/api/auth/callback/password', {
      csrfToken: csrf.csrfToken,
      email: user.email,
      password: TEST_PASSWORD,
      json: 'true',
      callbackUrl: decodeURIComponent(raw), // a form field carries the decoded value
    });
    expect(res.status).toBe(200);
    const { url } = (await res.json()) as { url: string };
    const parsed = new URL(url, BASE);
    expect(parsed.origin).toBe(origin);
    expect(url).not.toMatch(/evil|javascript|\\/i);
  });
});

describe('the auth catch-all answers junk with a 4xx, never a 500', () => {
  const JUNK: [string, string, string | undefined, string | undefined][] = [
    ['POST', '/api/auth/anything/anything', '{"a":1}', 'application/json'],
    ['POST', '/api/auth/callback/password', '{"email":"x@tests.example","password":"y"}', 'application/json'],
    ['POST', '/api/auth/callback/nothing-here', '{}', 'application/json'],
    ['POST', '/api/auth/signin/password', '{not json', 'application/json'],
    ['POST', '/api/auth/session', '{not json', 'application/json'],
    ['POST', '/api/auth/signout', '[1,2,3]', 'application/json'],
    ['POST', '/api/auth/_log', '"just a string"', 'application/json'],
    ['POST', '/api/auth/callback/password', 'callbackUrl=javascript%3Aalert(1)', 'application/x-www-form-urlencoded'],
    ['POST', '/api/auth/signin/password?callbackUrl=javascript:alert(1)', 'csrfToken=x', 'application/x-www-form-urlencoded'],
    ['POST', '/api/auth/callback/password', 'plain text', 'text/plain'],
    ['POST', '/api/auth/x', undefined, undefined],
    ['GET', '/api/auth/anything/anything', undefined, undefined],
    ['PUT', '/api/auth/session', '{}', 'application/json'],
  ];
  // A refusal (4xx) or next-auth's own "go back to sign-in" redirect (3xx); never a 5xx.
  test.each(JUNK)('%s %s (%s)', async (method, path, body, contentType) => {
    const res = await fetch(BASE + path, {
      method,
      body,
      headers: contentType ? { 'content-type': contentType } : {},
      redirect: 'manual',
    });
    expect(res.status, await res.text()).toBeGreaterThanOrEqual(300);
    expect(res.status).toBeLessThan(500);
  });

  test('a callback URL that is not a URL in the query is no 500', async () => {
    const res = await fetch(`${BASE}/api/auth/session?callbackUrl=javascript:alert(1)`);
    expect(res.status).toBeLessThan(500);
  });

  test('a callback-url cookie that is not a URL of this site is a 4xx, not a 500', async () => {
    const res = await fetch(`${BASE}/api/auth/session`, {
      headers: { cookie: 'next-auth.callback-url=javascript:alert(1)' },
    });
    expect(res.status).toBeLessThan(500);
  });
});
