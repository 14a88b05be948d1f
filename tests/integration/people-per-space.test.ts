import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { BASE, HttpSession } from '../helpers/http';
import { errorOf, session, staffedSpace, type TestUser } from './auth-fixtures';

// Disabling is per membership (issue 11, finding 9): an admin of one space ends a person's access to
// that space only; the person's other spaces keep working, in the session already open and at the
// next sign-in. Real HTTP against the production build.

const db = testDb();
let north: Awaited<ReturnType<typeof staffedSpace>>;
let south: Awaited<ReturnType<typeof staffedSpace>>;

const patchPerson = (s: HttpSession, id: string, body: unknown) => s.post(`/api/people/${id}`, body, 'PATCH');
type Settings = { settings: { name: string } };
const spaceNameSeen = async (s: HttpSession) => ((await (await s.get('/api/settings')).json()) as Settings).settings.name;

/** Someone who is an admin in both spaces (so /api/settings shows which space a request ran in). */
async function inBoth(): Promise<TestUser> {
  const p = await makeUser(db, north.space.id, ['admin']);
  await db.insertInto('memberships').values({ space_id: south.space.id, user_id: p.id, roles: ['admin'] }).execute();
  return p;
}
const peopleOf = async (s: HttpSession) =>
  ((await (await s.get('/api/people')).json()) as { people: { id: string; disabled: boolean }[] }).people;

beforeAll(async () => {
  north = await staffedSpace(db);
  south = await staffedSpace(db);
});
afterAll(closeTestDb);

describe('disabling in one space', () => {
  test("ends that space's access only: the open session keeps the other space", async () => {
    const both = await inBoth();
    const theirs = await session(both);
    theirs.useSpace(north.space.id);
    expect(await spaceNameSeen(theirs)).toBe(north.space.name);

    const southAdmin = await session(south.people.admin);
    const res = await patchPerson(southAdmin, both.id, { disabled: true });
    expect(res.status).toBe(200);
    expect(((await res.json()) as { person: { disabled: boolean } }).person.disabled).toBe(true);

    // North still works in the session that was already open…
    expect((await theirs.get('/api/settings')).status).toBe(200);
    expect(await spaceNameSeen(theirs)).toBe(north.space.name);
    // …and asking for South no longer reaches South.
    theirs.useSpace(south.space.id);
    expect(await spaceNameSeen(theirs)).toBe(north.space.name);

    // Signing in afresh still works, into North.
    const again = await session(both);
    expect(await spaceNameSeen(again)).toBe(north.space.name);

    // The two spaces' people lists tell it apart.
    expect((await peopleOf(southAdmin)).find((p) => p.id === both.id)?.disabled).toBe(true);
    const northAdmin = await session(north.people.admin);
    expect((await peopleOf(northAdmin)).find((p) => p.id === both.id)?.disabled).toBe(false);
  });

  test('a person disabled in their only space is nobody at once and cannot sign in', async () => {
    const only = await makeUser(db, south.space.id, ['member']);
    const theirs = await session(only);
    const saved = theirs.cookieHeader();
    const southAdmin = await session(south.people.admin);
    expect((await patchPerson(southAdmin, only.id, { disabled: true })).status).toBe(200);
    const res = await fetch(`${BASE}/api/loans`, { headers: { cookie: saved } });
    expect(res.status).toBe(401);
    expect((await errorOf(res)).code).toBe('unauthenticated');
    const s = new HttpSession();
    await s.signIn(only.email, TEST_PASSWORD);
    expect(await s.isSignedIn()).toBe(false);

    // Enabled again in that space, they are back.
    expect((await patchPerson(southAdmin, only.id, { disabled: false })).status).toBe(200);
    expect(await session(only).then((x) => x.get('/api/loans')).then((r) => r.status)).toBe(200);
  });

  test("an admin of another space cannot touch a person's membership here (404)", async () => {
    const both = await inBoth();
    const southAdmin = await session(south.people.admin);
    // The South admin aims at the North-only member: not in South, so 404 and nothing changes.
    const res = await patchPerson(southAdmin, north.people.member.id, { disabled: true });
    expect(res.status).toBe(404);
    const row = await db
      .selectFrom('memberships')
      .select('disabled_at')
      .where('space_id', '=', north.space.id)
      .where('user_id', '=', north.people.member.id)
      .executeTakeFirstOrThrow();
    expect(row.disabled_at).toBeNull();
    // And disabling the shared person in South leaves their North membership as it was.
    expect((await patchPerson(southAdmin, both.id, { disabled: true })).status).toBe(200);
    const rows = await db
      .selectFrom('memberships')
      .select(['space_id', 'disabled_at'])
      .where('user_id', '=', both.id)
      .execute();
    expect(rows.find((r) => r.space_id === north.space.id)?.disabled_at).toBeNull();
    expect(rows.find((r) => r.space_id === south.space.id)?.disabled_at).not.toBeNull();
  });

  test('disabling the last admin of another space is allowed here: that space keeps its admin', async () => {
    const lone = await makeUser(db, north.space.id, ['member']);
    const elsewhere = await staffedSpace(db);
    await db.deleteFrom('memberships').where('space_id', '=', elsewhere.space.id).where('user_id', '=', elsewhere.people.admin.id).execute();
    await db.insertInto('memberships').values({ space_id: elsewhere.space.id, user_id: lone.id, roles: ['admin'] }).execute();
    const northAdmin = await session(north.people.admin);
    expect((await patchPerson(northAdmin, lone.id, { disabled: true })).status).toBe(200);
    const theirs = await session(lone);
    theirs.useSpace(elsewhere.space.id);
    expect(await spaceNameSeen(theirs)).toBe(elsewhere.space.name);
  });
});
