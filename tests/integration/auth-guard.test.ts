import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Role } from '@/db/types';
import { closeTestDb, makeUser, testDb, uniq } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { errorOf, openInvitation, session, staffedSpace } from './auth-fixtures';

// The role guard over real HTTP: every protected route handler of People, invitations and Settings
// answers 401 to nobody, 403 to the wrong role, 2xx to the right one; and a record of another space
// answers 404 (never 403: its existence is not confirmed).

const db = testDb();
let home: Awaited<ReturnType<typeof staffedSpace>>;
let other: Awaited<ReturnType<typeof staffedSpace>>;
const sessions = {} as Record<Role | 'anonymous', HttpSession>;

type Case = {
  name: string;
  method: 'GET' | 'POST' | 'PATCH' | 'DELETE';
  path: () => Promise<string> | string;
  body?: () => unknown;
  ok: number;
};

// Each case is built fresh per call so the admin's successful call never spends what the next needs.
const CASES: Case[] = [
  { name: 'list people', method: 'GET', path: () => '/api/people', ok: 200 },
  {
    name: 'change roles',
    method: 'PATCH',
    path: () => `/api/people/${home.people.member.id}`,
    body: () => ({ roles: ['member'] }),
    ok: 200,
  },
  {
    name: 'disable/enable',
    method: 'PATCH',
    path: () => `/api/people/${home.people.member.id}`,
    body: () => ({ disabled: false }),
    ok: 200,
  },
  { name: 'list invitations', method: 'GET', path: () => '/api/invitations', ok: 200 },
  {
    name: 'invite',
    method: 'POST',
    path: () => '/api/invitations',
    body: () => ({ name: 'Guard check', email: `${uniq('guard')}@tests.example`, roles: ['member'] }),
    ok: 201,
  },
  {
    name: 'withdraw an invitation',
    method: 'DELETE',
    path: async () => `/api/invitations/${(await openInvitation(db, home.space.id)).id}`,
    ok: 200,
  },
  { name: 'read settings', method: 'GET', path: () => '/api/settings', ok: 200 },
  {
    name: 'change settings',
    method: 'PATCH',
    path: () => '/api/settings',
    body: () => ({ reminderEveryDays: 4 }),
    ok: 200,
  },
];

async function call(s: HttpSession, c: Case): Promise<Response> {
  const path = await c.path();
  if (c.method === 'GET') return s.get(path);
  return s.post(path, c.body?.(), c.method);
}

beforeAll(async () => {
  home = await staffedSpace(db);
  other = await staffedSpace(db);
  sessions.anonymous = new HttpSession();
  for (const role of ['admin', 'steward', 'treasurer', 'member'] as const)
    sessions[role] = await session(home.people[role]);
});
afterAll(closeTestDb);

describe.each(CASES)('$method $name', (c) => {
  test('anonymous: 401', async () => {
    const res = await call(sessions.anonymous, c);
    expect(res.status).toBe(401);
    expect((await errorOf(res)).code).toBe('unauthenticated');
  });

  test.each(['member', 'steward', 'treasurer'] as const)('%s: 403', async (role) => {
    const res = await call(sessions[role], c);
    expect(res.status).toBe(403);
    expect((await errorOf(res)).code).toBe('forbidden');
  });

  test('admin: allowed', async () => {
    const res = await call(sessions.admin, c);
    expect(res.status).toBe(c.ok);
  });
});

describe('public routes stay public', () => {
  test('accepting an invitation needs no session: a bad token is 404, not 401', async () => {
    const res = await sessions.anonymous.post('/api/invitations/accept', {
      token: 'A'.repeat(43),
      name: 'X',
      password: 'long-enough-1',
    });
    expect(res.status).toBe(404);
  });

  test('asking for a sign-in link needs no session', async () => {
    const res = await sessions.anonymous.post('/api/sign-in-link', {
      email: `${uniq('nobody')}@tests.example`,
    });
    expect(res.status).toBe(200);
  });
});

describe('roles are per space', () => {
  test('an admin here who is a member elsewhere is refused once they switch space', async () => {
    const both = await makeUser(db, home.space.id, ['admin']);
    await db
      .insertInto('memberships')
      .values({ space_id: other.space.id, user_id: both.id, roles: ['member'] })
      .execute();
    const s = await session(both);
    s.useSpace(home.space.id);
    expect((await s.get('/api/people')).status).toBe(200);
    s.useSpace(other.space.id);
    expect((await s.get('/api/people')).status).toBe(403);
    expect((await s.get('/api/settings')).status).toBe(403);
  });

  test('a space cookie for a space the person is not in falls back to their own space', async () => {
    const s = sessions.admin;
    s.useSpace(other.space.id);
    const res = await s.get('/api/settings');
    expect(res.status).toBe(200);
    expect(((await res.json()) as { settings: { name: string } }).settings.name).toBe(home.space.name);
    s.useSpace(home.space.id);
  });
});

describe("another space's records answer 404", () => {
  test('PATCH a person of another space: 404, and nothing changes there', async () => {
    const target = other.people.member;
    for (const body of [{ roles: ['admin'] }, { disabled: true }]) {
      const res = await sessions.admin.post(`/api/people/${target.id}`, body, 'PATCH');
      expect(res.status).toBe(404);
      expect((await errorOf(res)).code).toBe('not_found');
    }
    const row = await db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select(['memberships.roles', 'users.disabled_at'])
      .where('memberships.space_id', '=', other.space.id)
      .where('memberships.user_id', '=', target.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ roles: ['member'], disabled_at: null });
  });

  test('withdraw an invitation of another space: 404, and it stays open', async () => {
    const inv = await openInvitation(db, other.space.id);
    const res = await sessions.admin.post(`/api/invitations/${inv.id}`, undefined, 'DELETE');
    expect(res.status).toBe(404);
    const row = await db
      .selectFrom('invitations')
      .select(['expires_at'])
      .where('id', '=', inv.id)
      .executeTakeFirstOrThrow();
    expect(row.expires_at.getTime()).toBeGreaterThan(Date.now());
  });

  test("lists show only this space's people and invitations", async () => {
    const inv = await openInvitation(db, other.space.id);
    const people = (await (await sessions.admin.get('/api/people')).json()) as { people: { id: string }[] };
    const ids = people.people.map((p) => p.id);
    expect(ids).toEqual(expect.arrayContaining(Object.values(home.people).map((p) => p.id)));
    for (const p of Object.values(other.people)) expect(ids).not.toContain(p.id);
    const invitations = (await (await sessions.admin.get('/api/invitations')).json()) as {
      invitations: { id: string }[];
    };
    expect(invitations.invitations.map((i) => i.id)).not.toContain(inv.id);
  });

  test('a malformed id is a 404, like every [id] route (one id rule: lib/http/route.ts)', async () => {
    const res = await sessions.admin.post('/api/people/not-a-uuid', { roles: ['member'] }, 'PATCH');
    expect(res.status).toBe(404);
    expect((await errorOf(res)).message).toBe('No such person.');
  });
});
