import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeMailTransports } from '@/lib/mail/send';
import { runReminderSweep } from '@/lib/reminders/sweep';
import { closeTestDb, makeUser, testDb } from '../helpers/db';
import { setAppClock, type HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeUnit, type ErrorBody } from './loans-fixtures';

// The opening calendar through real HTTP: the admin saves opening hours and closed dates, a borrow's due
// date lands on the next opening at its closing time in the space's zone (dates worked by hand in the
// comments; zone offsets from the IANA tz database), and the scheduled reminder sweep keeps quiet on
// days the space is shut and leaves a member alone for the space's configured pause.

const db = testDb();
const HOUR = 3_600_000;
const DAY = 24 * HOUR;
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let admin: HttpSession;
let member: HttpSession[];

const HOURS = { opens: '10:00', closes: '18:00' };
const WEEK = { mon: HOURS, tue: HOURS, wed: HOURS, thu: HOURS, fri: HOURS, sat: { opens: '10:00', closes: '14:00' }, sun: null };

beforeAll(async () => {
  fx = await loanSpace(db, { members: 3, timeZone: 'Europe/Berlin' });
  await db.updateTable('spaces').set({ loan_days: 7, closing_time: '20:00', max_open_loans: 10 }).where('id', '=', fx.space.id).execute();
  parts = await chainParts(db, fx.space.id);
  admin = await login(await makeUser(db, fx.space.id, ['admin'], 'Calendar admin'));
  member = await Promise.all(fx.members.map(login));
});
afterAll(async () => {
  await setAppClock(0).catch(() => undefined);
  closeMailTransports();
  await closeTestDb();
});

async function borrowAt(instant: string, who: HttpSession) {
  const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
  await setAppClock(Date.parse(instant) - Date.now());
  try {
    const res = await who.post('/api/loans', { unitIds: [meter.id] });
    expect(res.status).toBe(201);
    return (await json<{ loan: { id: string; dueAt: string } }>(res)).loan;
  } finally {
    await setAppClock(0);
  }
}

describe('due dates on the opening calendar', () => {
  test('the admin saves opening hours and the Christmas closure', async () => {
    const res = await admin.post(
      '/api/settings/borrowing',
      { week: WEEK, closedDates: ['2026-12-26', '2026-12-24', '2026-12-25'] },
      'PATCH',
    );
    expect(res.status).toBe(200);
    const { rules } = await json<{ rules: { week: unknown; closedDates: string[] } }>(res);
    expect(rules.week).toEqual(WEEK);
    expect(rules.closedDates).toEqual(['2026-12-24', '2026-12-25', '2026-12-26']);
  });

  test('over a holiday: out Thu 17 Dec 2026 15:00 Berlin for 7 days → Monday 28 Dec, 18:00 CET (17:00 UTC)', async () => {
    // Last day Thu 24 Dec (closed date); 25, 26 closed dates; Sun 27 shut; Mon 28 closes 18:00 CET = UTC+1.
    const loan = await borrowAt('2026-12-17T14:00:00Z', member[0]);
    expect(loan.dueAt).toBe('2026-12-28T17:00:00.000Z');
    const row = await db.selectFrom('loans').select('due_at').where('id', '=', loan.id).executeTakeFirstOrThrow();
    expect(row.due_at.toISOString()).toBe('2026-12-28T17:00:00.000Z');
  });

  test('across the spring clock change: out Sun 21 Mar 2027 12:00 CET → Mon 29 Mar, 18:00 CEST (16:00 UTC)', async () => {
    // Last day Sun 28 Mar 2027, the day Berlin moves to UTC+2, is shut; Monday closes 18:00 CEST.
    const loan = await borrowAt('2027-03-21T11:00:00Z', member[1]);
    expect(loan.dueAt).toBe('2027-03-29T16:00:00.000Z');
  });

  test('a day that opens is due that day: out Sat 12 Dec 2026 for 7 days → Sat 19 Dec, 14:00 CET (13:00 UTC)', async () => {
    const loan = await borrowAt('2026-12-12T10:00:00Z', member[2]);
    expect(loan.dueAt).toBe('2026-12-19T13:00:00.000Z');
  });
});

describe('the reminder sweep and the calendar', () => {
  /** An overdue loan of `userId`: due at `dueAt`. */
  async function loanDue(userId: string, dueAt: string) {
    const unit = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const loan = await db
      .insertInto('loans')
      .values({ space_id: fx.space.id, borrower_id: userId, lent_by_id: fx.steward.id, out_at: new Date(Date.parse(dueAt) - 7 * DAY), due_at: dueAt })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.insertInto('loan_lines').values({ loan_id: loan.id, space_id: fx.space.id, part_id: parts.meter.id, unit_id: unit.id, qty: 1 }).execute();
    return loan.id;
  }
  const remindersOf = (ids: string[]) =>
    db.selectFrom('reminders').select(['loan_id', 'kind', 'for_day']).where('loan_id', 'in', ids).orderBy('created_at').execute();

  test('nothing is queued on a closed day; the first open day catches up once', async () => {
    const someone = await makeUser(db, fx.space.id, ['member'], 'Calendar sweep member');
    // Due Wed 23 Dec 2026 18:00 CET; overdue from the 24th, which is closed, as are the 25th, 26th and the Sunday.
    const loanId = await loanDue(someone.id, '2026-12-23T17:00:00Z');
    await runReminderSweep(db, new Date('2026-12-24T09:00:00Z'), { spaceId: fx.space.id });
    await runReminderSweep(db, new Date('2026-12-27T09:00:00Z'), { spaceId: fx.space.id });
    expect(await remindersOf([loanId])).toEqual([]);
    await runReminderSweep(db, new Date('2026-12-28T09:00:00Z'), { spaceId: fx.space.id });
    await runReminderSweep(db, new Date('2026-12-28T11:00:00Z'), { spaceId: fx.space.id });
    expect((await remindersOf([loanId])).map((r) => r.kind)).toEqual(['overdue']);
  });

  test('a member with three overdue loans hears once per run, and not again within the space’s pause', async () => {
    expect((await admin.post('/api/settings/borrowing', { reminderPauseHours: 48 }, 'PATCH')).status).toBe(200);
    const someone = await makeUser(db, fx.space.id, ['member'], 'Three loans member');
    const ids = [
      await loanDue(someone.id, '2027-02-01T17:00:00Z'),
      await loanDue(someone.id, '2027-02-01T17:00:00Z'),
      await loanDue(someone.id, '2027-02-01T17:00:00Z'),
    ];
    // Thu 4 Feb 2027, Fri 5 Feb, Sat 6 Feb: all open days; reminders owed every day (every 1 day by default).
    await db.updateTable('spaces').set({ reminder_every_days: 1 }).where('id', '=', fx.space.id).execute();
    await runReminderSweep(db, new Date('2027-02-04T09:00:00Z'), { spaceId: fx.space.id });
    await runReminderSweep(db, new Date('2027-02-04T11:00:00Z'), { spaceId: fx.space.id });
    expect(await remindersOf(ids)).toHaveLength(1);
    // 24 hours later: inside the 48-hour pause, nothing.
    await runReminderSweep(db, new Date('2027-02-05T09:00:00Z'), { spaceId: fx.space.id });
    expect(await remindersOf(ids)).toHaveLength(1);
    // 49 hours later: one more (another of the loans, or the same one's next day).
    await runReminderSweep(db, new Date('2027-02-06T10:00:00Z'), { spaceId: fx.space.id });
    expect(await remindersOf(ids)).toHaveLength(2);
  });

  test('a manual reminder inside the configured pause names its length', async () => {
    const someone = await makeUser(db, fx.space.id, ['member'], 'Manual pause member');
    const loanId = await loanDue(someone.id, new Date(Date.now() + 300 * DAY).toISOString());
    const steward = await login(fx.steward);
    expect((await steward.post('/api/reminders', { loanIds: [loanId] })).status).toBe(200);
    const again = await steward.post('/api/reminders', { loanIds: [loanId] });
    expect(again.status).toBe(409);
    expect((await json<ErrorBody>(again)).error.message).toMatch(/less than 48 hours ago/);
  });
});
