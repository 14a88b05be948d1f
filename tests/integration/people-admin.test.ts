import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { sql } from 'kysely';
import { hashToken } from '@/lib/auth/tokens';
import { closeTestDb, makeSpace, makeUser, testDb, TEST_PASSWORD, uniq } from '../helpers/db';
import { HttpSession, signedIn } from '../helpers/http';
import { errorOf, session, staffedSpace, tokenFromMail } from './auth-fixtures';

// People and invitations through the real route handlers: roles, the last-admin rule, disabling,
// and an invitation from the e-mail at the SMTP sink to the first sign-in.

const db = testDb();
let home: Awaited<ReturnType<typeof staffedSpace>>;
let admin: HttpSession;

const patchPerson = (s: HttpSession, id: string, body: unknown) => s.post(`/api/people/${id}`, body, 'PATCH');
const rolesOf = async (spaceId: string, userId: string) =>
  (
    await db
      .selectFrom('memberships')
      .select('roles')
      .where('space_id', '=', spaceId)
      .where('user_id', '=', userId)
      .executeTakeFirst()
  )?.roles;
const lastAudit = (spaceId: string, action: string) =>
  db
    .selectFrom('audit_log')
    .select(['actor_id', 'target_id', 'detail'])
    .where('space_id', '=', spaceId)
    .where('action', '=', action)
    .orderBy('id', 'desc')
    .executeTakeFirst();

/**
 * One change wins; the loser is refused as no longer an (enabled) admin: 403 when demoted, or 401 when the
 * winner disabled their account before the guard read it (a disabled person is nobody).
 */
function expectOneWinner(answers: Response[]) {
  const statuses = answers.map((r) => r.status).sort();
  expect(statuses[0]).toBe(200);
  expect([401, 403]).toContain(statuses[1]);
}

beforeAll(async () => {
  home = await staffedSpace(db);
  admin = await session(home.people.admin);
});
afterAll(closeTestDb);

describe('roles', () => {
  test('an admin gives a person several roles; the change is stored, audited and takes effect at once', async () => {
    const person = await makeUser(db, home.space.id, ['member']);
    const theirs = await session(person);
    expect((await theirs.get('/api/people')).status).toBe(403);

    const res = await patchPerson(admin, person.id, { roles: ['admin', 'member', 'steward'] });
    expect(res.status).toBe(200);
    // Kept in the fixed order member, steward, treasurer, admin.
    expect(((await res.json()) as { person: { roles: string[] } }).person.roles).toEqual([
      'member',
      'steward',
      'admin',
    ]);
    expect(await rolesOf(home.space.id, person.id)).toEqual(['member', 'steward', 'admin']);
    const entry = await lastAudit(home.space.id, 'person.updated');
    expect(entry).toMatchObject({ actor_id: home.people.admin.id, target_id: person.id });
    expect(entry?.detail).toMatchObject({
      rolesBefore: ['member'],
      rolesAfter: ['member', 'steward', 'admin'],
    });

    // Roles are read on every request, so the open session gains the new role without signing in again.
    expect((await theirs.get('/api/people')).status).toBe(200);
  });

  test('bad roles are a 400 naming the field', async () => {
    for (const [body, field] of [
      [{ roles: [] }, 'roles'],
      [{ roles: ['boss'] }, 'roles.0'],
      [{}, 'roles'],
      [{ disabled: 'yes' }, 'disabled'],
    ] as const) {
      const res = await patchPerson(admin, home.people.member.id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys((await errorOf(res)).fields ?? {})).toContain(field);
    }
  });
});

describe('the last admin of a space', () => {
  test('cannot lose the admin role or be disabled (409), and nothing changes', async () => {
    const space = await makeSpace(db);
    const only = await makeUser(db, space.id, ['admin', 'member']);
    const s = await session(only);
    const res = await patchPerson(s, only.id, { roles: ['member'] });
    expect(res.status).toBe(409);
    expect(Object.keys((await errorOf(res)).fields ?? {})).toEqual(['roles']);
    expect(await rolesOf(space.id, only.id)).toEqual(['admin', 'member']); // as stored, untouched
    // Nor can an admin disable their own account.
    expect((await patchPerson(s, only.id, { disabled: true })).status).toBe(409);

    // With a second admin the first may step down.
    const second = await makeUser(db, space.id, ['admin']);
    expect((await patchPerson(s, only.id, { roles: ['member'] })).status).toBe(200);
    // ...and now the second is the last one.
    const s2 = await session(second);
    expect((await patchPerson(s2, second.id, { roles: ['steward'] })).status).toBe(409);
    expect(await rolesOf(space.id, second.id)).toEqual(['admin']);
  });

  test('switching access off here leaves the admin of another space in charge there', async () => {
    const elsewhere = await makeSpace(db);
    const person = await makeUser(db, elsewhere.id, ['admin']);
    await db
      .insertInto('memberships')
      .values({ space_id: home.space.id, user_id: person.id, roles: ['member'] })
      .execute();
    expect((await patchPerson(admin, person.id, { disabled: true })).status).toBe(200);
    const rows = await db
      .selectFrom('memberships')
      .select(['space_id', 'disabled_at'])
      .where('user_id', '=', person.id)
      .execute();
    expect(rows.find((r) => r.space_id === elsewhere.id)?.disabled_at).toBeNull();
    expect(rows.find((r) => r.space_id === home.space.id)?.disabled_at).not.toBeNull();
    const theirs = await session(person);
    theirs.useSpace(elsewhere.id);
    expect((await theirs.get('/api/people')).status).toBe(200);
  });

  test('two admins removing each other at the same moment: exactly one succeeds', async () => {
    const space = await makeSpace(db);
    const a = await makeUser(db, space.id, ['admin', 'member']);
    const b = await makeUser(db, space.id, ['admin', 'member']);
    const [sa, sb] = await Promise.all([session(a), session(b)]);
    const answers = await Promise.all([
      patchPerson(sa, b.id, { roles: ['member'] }),
      patchPerson(sb, a.id, { roles: ['member'] }),
    ]);
    expectOneWinner(answers);
    const admins = await db
      .selectFrom('memberships')
      .select('user_id')
      .where('space_id', '=', space.id)
      .where(sql<boolean>`'admin' = any(roles)`)
      .execute();
    expect(admins).toHaveLength(1);
  });

  test('one admin disabling the other while being demoted by them: exactly one succeeds', async () => {
    const space = await makeSpace(db);
    const a = await makeUser(db, space.id, ['admin']);
    const b = await makeUser(db, space.id, ['admin']);
    const [sa, sb] = await Promise.all([session(a), session(b)]);
    const answers = await Promise.all([
      patchPerson(sa, b.id, { disabled: true }),
      patchPerson(sb, a.id, { roles: ['member'] }),
    ]);
    expectOneWinner(answers);
    const active = await db
      .selectFrom('memberships')
      .select('user_id')
      .where('space_id', '=', space.id)
      .where(sql<boolean>`'admin' = any(roles)`)
      .where('disabled_at', 'is', null)
      .execute();
    expect(active).toHaveLength(1);
  });
});

describe('switching access off', () => {
  test('in their only space ends their open session and their sign-ins until switched on again', async () => {
    const person = await makeUser(db, home.space.id, ['member', 'admin']);
    const theirs = await session(person);
    expect((await theirs.get('/api/settings')).status).toBe(200);

    const off = await patchPerson(admin, person.id, { disabled: true });
    expect(off.status).toBe(200);
    expect(((await off.json()) as { person: { disabled: boolean } }).person.disabled).toBe(true);
    expect((await theirs.get('/api/settings')).status).toBe(401);
    const again = new HttpSession();
    await again.signIn(person.email, TEST_PASSWORD);
    expect(await again.isSignedIn()).toBe(false);
    expect((await lastAudit(home.space.id, 'person.updated'))?.detail).toMatchObject({ disabled: true });

    expect((await patchPerson(admin, person.id, { disabled: false })).status).toBe(200);
    const back = await signedIn(person.email, TEST_PASSWORD);
    expect((await back.get('/api/settings')).status).toBe(200);
  });
});

describe('invitations', () => {
  const invite = (body: unknown) => admin.post('/api/invitations', body);

  test('invite → e-mail at the sink → welcome page → choose a password → signed in, once only', async () => {
    const email = `${uniq('newcomer')}@tests.example`;
    const res = await invite({ name: 'Newcomer Person', email, roles: ['member', 'treasurer'] });
    expect(res.status).toBe(201);
    const { invitation } = (await res.json()) as { invitation: { id: string; roles: string[] } };
    expect(invitation.roles).toEqual(['member', 'treasurer']);
    expect((await lastAudit(home.space.id, 'invitation.created'))?.target_id).toBe(invitation.id);

    const { token } = await tokenFromMail(email, '/welcome');
    const row = await db
      .selectFrom('invitations')
      .select('token_hash')
      .where('id', '=', invitation.id)
      .executeTakeFirstOrThrow();
    expect(row.token_hash).toBe(hashToken(token)); // only the hash is kept

    const anon = new HttpSession();
    const page = await anon.get(`/welcome?token=${token}`);
    expect(page.status).toBe(200);
    const html = (await page.text()).replaceAll('<!-- -->', ''); // React's text-node separators
    expect(html).toContain(`Welcome to ${home.space.name}`);
    expect(html).toContain(email);
    expect(html).toContain('You are invited as member, treasurer');

    const short = await anon.post('/api/invitations/accept', {
      token,
      name: 'Newcomer Person',
      password: 'short',
    });
    expect(short.status).toBe(400);
    expect(Object.keys((await errorOf(short)).fields ?? {})).toEqual(['password']);

    const password = 'a fine long password';
    const ok = await anon.post('/api/invitations/accept', { token, name: 'Newcomer Person', password });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ email, newAccount: true });

    const theirs = await signedIn(email, password);
    const user = await db
      .selectFrom('users')
      .select(['id', 'name', 'last_space_id'])
      .where('email', '=', email)
      .executeTakeFirstOrThrow();
    expect(user).toMatchObject({ name: 'Newcomer Person', last_space_id: home.space.id });
    expect(await rolesOf(home.space.id, user.id)).toEqual(['member', 'treasurer']);
    expect((await lastAudit(home.space.id, 'invitation.accepted'))?.actor_id).toBe(user.id);
    expect((await theirs.get('/api/people')).status).toBe(403); // treasurer and member, not admin

    const twice = await new HttpSession().post('/api/invitations/accept', {
      token,
      name: 'Someone Else',
      password: 'another long password',
    });
    expect(twice.status).toBe(404);
    expect(await (await anon.get(`/welcome?token=${token}`)).text()).toContain(
      'This invitation cannot be used',
    );
  });

  test('someone with an account elsewhere gets the space added and keeps their password', async () => {
    const elsewhere = await makeSpace(db);
    const known = await makeUser(db, elsewhere.id, ['member']);
    expect(
      (await invite({ name: 'Known Person', email: known.email.toUpperCase(), roles: ['steward'] })).status,
    ).toBe(201);
    const { token } = await tokenFromMail(known.email, '/welcome');
    expect(await (await new HttpSession().get(`/welcome?token=${token}`)).text()).toContain(
      'already have an Ohmstead account',
    );

    const ok = await new HttpSession().post('/api/invitations/accept', { token });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ email: known.email, newAccount: false });
    expect(await rolesOf(home.space.id, known.id)).toEqual(['steward']);
    expect(await rolesOf(elsewhere.id, known.id)).toEqual(['member']);

    const s = await signedIn(known.email, TEST_PASSWORD);
    s.useSpace(home.space.id);
    expect((await s.get('/api/people')).status).toBe(403); // a steward here
  });

  test('inviting the same address again retires the earlier link', async () => {
    const email = `${uniq('twice')}@tests.example`;
    expect((await invite({ name: 'Twice Invited', email, roles: ['member'] })).status).toBe(201);
    const first = await tokenFromMail(email, '/welcome');
    expect((await invite({ name: 'Twice Invited', email, roles: ['steward'] })).status).toBe(201);
    const second = await tokenFromMail(email, '/welcome', (text) => !text.includes(first.token));

    const stale = await new HttpSession().post('/api/invitations/accept', {
      token: first.token,
      name: 'T',
      password: 'long enough password',
    });
    expect(stale.status).toBe(404);
    const fresh = await new HttpSession().post('/api/invitations/accept', {
      token: second.token,
      name: 'T',
      password: 'long enough password',
    });
    expect(fresh.status).toBe(200);
  });

  test('a withdrawn or expired invitation cannot be accepted', async () => {
    const email = `${uniq('withdrawn')}@tests.example`;
    const { invitation } = (await (await invite({ name: 'Withdrawn', email, roles: ['member'] })).json()) as {
      invitation: { id: string };
    };
    const { token } = await tokenFromMail(email, '/welcome');
    expect((await admin.post(`/api/invitations/${invitation.id}`, undefined, 'DELETE')).status).toBe(200);
    const listed = (await (await admin.get('/api/invitations')).json()) as { invitations: { id: string }[] };
    expect(listed.invitations.map((i) => i.id)).not.toContain(invitation.id);
    expect(
      (
        await new HttpSession().post('/api/invitations/accept', {
          token,
          name: 'W',
          password: 'long enough password',
        })
      ).status,
    ).toBe(404);

    const late = `${uniq('late')}@tests.example`;
    const { invitation: lateInv } = (await (
      await invite({ name: 'Late', email: late, roles: ['member'] })
    ).json()) as { invitation: { id: string } };
    const lateToken = (await tokenFromMail(late, '/welcome')).token;
    await db
      .updateTable('invitations')
      .set({ expires_at: new Date(Date.now() - 1000) })
      .where('id', '=', lateInv.id)
      .execute();
    expect(
      (
        await new HttpSession().post('/api/invitations/accept', {
          token: lateToken,
          name: 'L',
          password: 'long enough password',
        })
      ).status,
    ).toBe(404);
  });

  test('someone already in the space is not invited again (409 on email)', async () => {
    const res = await invite({ name: 'Again', email: home.people.member.email, roles: ['member'] });
    expect(res.status).toBe(409);
    expect(Object.keys((await errorOf(res)).fields ?? {})).toEqual(['email']);
  });

  test('bad invitations are a 400 naming each field', async () => {
    for (const [body, field] of [
      [{ name: 'X', email: 'not-an-address', roles: ['member'] }, 'email'],
      [{ name: '', email: 'x@tests.example', roles: ['member'] }, 'name'],
      [{ name: 'X', email: 'x@tests.example', roles: [] }, 'roles'],
      [{ name: 'X', email: 'x@tests.example', roles: ['owner'] }, 'roles.0'],
      [{ name: 'X', email: 'x@tests.example' }, 'roles'],
    ] as const) {
      const res = await invite(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys((await errorOf(res)).fields ?? {})).toContain(field);
    }
    const notJson = await admin.post('/api/invitations', '{not json');
    expect(notJson.status).toBe(400);
    expect(Object.keys((await errorOf(notJson)).fields ?? {})).toEqual(['(body)']);
  });
});
