import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeUnit, type ErrorBody } from './loans-fixtures';

// Presence, through real HTTP against real PostgreSQL. In a space with bench hand-over a member's borrow
// waits at the bench (no loan, no due date running) until a steward hands it over — exactly once, even
// with two stewards pressing at the same moment — and a member's return is back, not yet checked, until
// a steward confirms what came back. With self-service both take effect at once.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let admin: HttpSession;
let stewards: HttpSession[];
let member: HttpSession[];

beforeAll(async () => {
  fx = await loanSpace(db, { members: 3, timeZone: 'UTC' });
  await db.updateTable('spaces').set({ max_open_loans: 50 }).where('id', '=', fx.space.id).execute();
  parts = await chainParts(db, fx.space.id);
  admin = await login(await makeUser(db, fx.space.id, ['admin'], 'Presence admin'));
  stewards = [await login(fx.steward), await login(await makeUser(db, fx.space.id, ['steward'], 'Second steward'))];
  member = await Promise.all(fx.members.map(login));
  const res = await admin.post('/api/settings/borrowing', { presence: 'bench_handover' }, 'PATCH');
  expect(res.status).toBe(200);
});
afterAll(closeTestDb);

const unitState = async (id: string) =>
  (await db.selectFrom('units').select('state').where('id', '=', id).executeTakeFirstOrThrow()).state;
const loanRow = (id: string) =>
  db.selectFrom('loans').select(['status', 'handed_over_by', 'handed_over_at', 'due_at', 'out_at']).where('id', '=', id).executeTakeFirstOrThrow();

async function memberBorrows(who: HttpSession) {
  const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
  const res = await who.post('/api/loans', { unitIds: [meter.id] });
  expect(res.status).toBe(201);
  const { loan } = await json<{ loan: { id: string; status: string } }>(res);
  return { loan, meter };
}

describe('bench hand-over', () => {
  test('a member’s borrow waits at the bench: kept for them, not yet a loan', async () => {
    const { loan, meter } = await memberBorrows(member[0]);
    expect(loan.status).toBe('waiting');
    expect((await loanRow(loan.id)).handed_over_at).toBeNull();
    // Kept for them: nobody else can take it meanwhile.
    const other = await member[1].post('/api/loans', { unitIds: [meter.id] });
    expect(other.status).toBe(409);
    const seen = await json<{ loan: { status: string } }>(await member[0].get(`/api/loans/${loan.id}`));
    expect(seen.loan.status).toBe('waiting');
    // A member cannot hand it over to themselves.
    expect((await member[0].post(`/api/loans/${loan.id}/hand-over`)).status).toBe(403);
    // Nor say it is back before they had it.
    expect((await member[0].post(`/api/loans/${loan.id}/return`, {})).status).toBe(409);
  });

  test('two stewards hand over the same borrow at once: exactly one does, the other is told who', async () => {
    for (let round = 0; round < 5; round++) {
      const { loan, meter } = await memberBorrows(member[1]);
      const answers = await Promise.all(stewards.map((s) => s.post(`/api/loans/${loan.id}/hand-over`)));
      const statuses = answers.map((r) => r.status).sort();
      expect(statuses).toEqual([200, 409]);
      const refused = answers.find((r) => r.status === 409)!;
      expect((await json<ErrorBody>(refused)).error.message).toMatch(/^Already handed over by (Test steward|Second steward)\.$/);
      const row = await loanRow(loan.id);
      expect(row.status).toBe('out');
      expect(row.handed_over_by).not.toBeNull();
      const audits = await db
        .selectFrom('audit_log')
        .select('actor_id')
        .where('action', '=', 'loan.handed_over')
        .where('target_id', '=', loan.id)
        .execute();
      expect(audits).toEqual([{ actor_id: row.handed_over_by }]);
      expect(await unitState(meter.id)).toBe('out');
    }
  });

  test('the due date runs from the hand-over, not from the borrow', async () => {
    const { loan } = await memberBorrows(member[2]);
    await db.updateTable('loans').set({ out_at: new Date(Date.now() - 3 * 86_400_000) }).where('id', '=', loan.id).execute();
    const res = await stewards[0].post(`/api/loans/${loan.id}/hand-over`);
    expect(res.status).toBe(200);
    const row = await loanRow(loan.id);
    expect(Math.abs(row.out_at.getTime() - row.handed_over_at!.getTime())).toBe(0);
    expect(Date.now() - row.out_at.getTime()).toBeLessThan(60_000);
  });

  test('a member’s return is back, not yet checked, until a steward confirms it', async () => {
    const { loan, meter } = await memberBorrows(member[0]);
    expect((await stewards[0].post(`/api/loans/${loan.id}/hand-over`)).status).toBe(200);
    const back = await member[0].post(`/api/loans/${loan.id}/return`, { note: 'All back, fine' });
    expect(back.status).toBe(200);
    expect((await json<{ return: { status: string } }>(back)).return.status).toBe('back_unchecked');
    expect((await loanRow(loan.id)).status).toBe('back_unchecked');
    // Still not on the shelf: nobody has looked yet.
    expect(await unitState(meter.id)).toBe('out');
    const twice = await member[0].post(`/api/loans/${loan.id}/return`, {});
    expect(twice.status).toBe(409);
    expect((await json<ErrorBody>(twice)).error.message).toMatch(/a steward checks it/);

    const confirmed = await stewards[1].post(`/api/loans/${loan.id}/return`, {});
    expect(confirmed.status).toBe(200);
    expect((await json<{ return: { status: string } }>(confirmed)).return.status).toBe('returned');
    expect(await unitState(meter.id)).toBe('on_shelf');
  });

  test('a steward lending at the bench hands over at once', async () => {
    const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const res = await stewards[0].post('/api/loans', { unitIds: [meter.id], borrowerId: fx.members[2].id });
    expect(res.status).toBe(201);
    expect((await json<{ loan: { status: string } }>(res)).loan.status).toBe('out');
  });
});

describe('self-service', () => {
  test('a member’s borrow and return take effect at once', async () => {
    expect((await admin.post('/api/settings/borrowing', { presence: 'self_service' }, 'PATCH')).status).toBe(200);
    const { loan, meter } = await memberBorrows(member[2]);
    expect(loan.status).toBe('out');
    const back = await member[2].post(`/api/loans/${loan.id}/return`, {});
    expect((await json<{ return: { status: string } }>(back)).return.status).toBe('returned');
    expect(await unitState(meter.id)).toBe('on_shelf');
  });
});
