import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import { BASE, HttpSession } from '../helpers/http';
import { errorOf, session } from './auth-fixtures';

// Sessions end on the server (issue 11, finding 10): a session cookie saved before sign-out, and
// replayed afterwards, reads nothing. Real HTTP against the production build.

const db = testDb();
let spaceId: string;

/** Replays a saved Cookie header without the session that would forget it. */
const replay = (cookie: string, path: string) => fetch(BASE + path, { headers: { cookie }, redirect: 'manual' });

async function signOut(s: HttpSession): Promise<Response> {
  const csrf = (await (await s.get('/api/auth/csrf')).json()) as { csrfToken: string };
  return s.postForm('/api/auth/signout', { csrfToken: csrf.csrfToken, json: 'true' });
}

beforeAll(async () => {
  spaceId = (await makeSpace(db)).id;
});
afterAll(closeTestDb);

describe('sign-out ends the session on the server', () => {
  test('a session cookie saved before sign-out reads nothing afterwards', async () => {
    const member = await makeUser(db, spaceId, ['member']);
    const s = await session(member);
    const saved = s.cookieHeader();
    expect((await replay(saved, '/api/loans')).status).toBe(200);

    expect((await signOut(s)).status).toBe(200);
    const after = await replay(saved, '/api/loans');
    expect(after.status).toBe(401);
    expect((await errorOf(after)).code).toBe('unauthenticated');
    // next-auth's own session endpoint agrees: nobody.
    const body = (await (await replay(saved, '/api/auth/session')).json()) as { user?: unknown };
    expect(body.user).toBeUndefined();
    // Pages send the saved cookie to sign-in, too.
    const page = await replay(saved, '/loans');
    expect(page.status).toBe(307);
    expect(page.headers.get('location')).toMatch(/^\/signin\?next=/);
  });

  test('signing out on one device leaves the same person signed in on another', async () => {
    const member = await makeUser(db, spaceId, ['member']);
    const phone = await session(member);
    const laptop = await session(member);
    await signOut(phone);
    expect((await phone.get('/api/loans')).status).toBe(401);
    expect((await laptop.get('/api/loans')).status).toBe(200);
  });

  test('signing in again after signing out works', async () => {
    const member = await makeUser(db, spaceId, ['member']);
    const s = await session(member);
    await signOut(s);
    const again = await session(member);
    expect((await again.get('/api/loans')).status).toBe(200);
  });
});

describe('role changes act at the next request of a saved cookie', () => {
  test('an admin demoted to member loses admin answers at once', async () => {
    const admin = await makeUser(db, spaceId, ['admin']);
    const demoted = await makeUser(db, spaceId, ['admin', 'member']);
    const s = await session(demoted);
    const saved = s.cookieHeader();
    expect((await replay(saved, '/api/people')).status).toBe(200);
    const as = await session(admin);
    expect((await as.post(`/api/people/${demoted.id}`, { roles: ['member'] }, 'PATCH')).status).toBe(200);
    expect((await replay(saved, '/api/people')).status).toBe(403);
  });
});
