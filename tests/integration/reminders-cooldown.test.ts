import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { sql } from 'kysely';
import { listMessages } from '@/lib/mail/mailbox';
import { closeMailTransports } from '@/lib/mail/send';
import { REMINDER_PAUSE_HOURS } from '@/lib/reminders/pause';
import { runReminderSweep } from '@/lib/reminders/sweep';
import { closeTestDb, makeLocation, makePart, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { errorOf } from './auth-fixtures';
import { loanSpace, login } from './loans-fixtures';

// A member is not reminded of the same loan again and again (issue 11, finding 14): a manual reminder
// within the pause after the last one is refused with the time the next may go, and the scheduled sweep
// holds back too. Real HTTP for the manual reminders; the sweep run here "at" chosen instants.

const db = testDb();
const HOUR = 3_600_000;
const DAY = 24 * HOUR;
let fx: Awaited<ReturnType<typeof loanSpace>>;
let steward: HttpSession;

async function makeLoan(borrowerId: string, dueAt: Date): Promise<string> {
  const part = await makePart(db, fx.space.id, { name: 'Pause test crimp tool', category: 'tool' });
  const bin = await makeLocation(db, fx.space.id);
  const loan = await db
    .insertInto('loans')
    .values({ space_id: fx.space.id, borrower_id: borrowerId, lent_by_id: fx.steward.id, out_at: new Date(dueAt.getTime() - 7 * DAY), due_at: dueAt })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('loan_lines')
    .values({ loan_id: loan.id, space_id: fx.space.id, part_id: part.id, location_id: bin.id, qty: 1 })
    .execute();
  return loan.id;
}
const remindersOf = (loanId: string) =>
  db.selectFrom('reminders').select(['kind', 'status', 'created_at']).where('loan_id', '=', loanId).orderBy('created_at').execute();
/** Pretends every reminder of the loan went out `hours` earlier than it did. */
const age = (loanId: string, hours: number) =>
  db
    .updateTable('reminders')
    .set({
      created_at: sql<Date>`created_at - make_interval(secs => ${hours * 3600})`,
      sent_at: sql<Date>`sent_at - make_interval(secs => ${hours * 3600})`,
    })
    .where('loan_id', '=', loanId)
    .execute();

beforeAll(async () => {
  fx = await loanSpace(db, { timeZone: 'UTC', members: 3 });
  steward = await login(fx.steward);
});
afterAll(async () => {
  closeMailTransports();
  await closeTestDb();
});

describe('manual reminders', () => {
  test('a second reminder within the pause is refused (409) with when the next may go; nothing is sent', async () => {
    const member = fx.members[0];
    const loanId = await makeLoan(member.id, new Date(Date.now() + 400 * DAY)); // the app's own sweep owes it nothing
    const first = await steward.post('/api/reminders', { loanIds: [loanId] });
    expect(first.status).toBe(200);
    expect(await first.json()).toEqual({ reminders: { sent: 1, failed: 0 } });

    for (let i = 0; i < 3; i++) {
      const again = await steward.post('/api/reminders', { loanIds: [loanId] });
      expect(again.status).toBe(409);
      const err = await errorOf(again);
      expect(err.code).toBe('conflict');
      expect(err.message).toMatch(/next reminder can go/i);
      expect(err.message).toMatch(/\d{1,2}:\d{2}/); // names the time
      expect(Object.keys(err.fields ?? {})).toEqual(['loanIds.0']);
    }
    expect(await remindersOf(loanId)).toHaveLength(1);
    expect(await listMessages({ to: member.email })).toHaveLength(1);

    // Once the pause has passed, the next one goes.
    await age(loanId, REMINDER_PAUSE_HOURS + 0.1);
    expect((await steward.post('/api/reminders', { loanIds: [loanId] })).status).toBe(200);
    expect(await listMessages({ to: member.email })).toHaveLength(2);
  });

  test('ten parallel requests for one loan send one reminder', async () => {
    const member = fx.members[1];
    const loanId = await makeLoan(member.id, new Date(Date.now() + 401 * DAY));
    const answers = await Promise.all(Array.from({ length: 10 }, () => steward.post('/api/reminders', { loanIds: [loanId] })));
    expect(answers.map((r) => r.status).sort()).toEqual([200, ...Array(9).fill(409)]);
    expect(await remindersOf(loanId)).toHaveLength(1);
    expect(await listMessages({ to: member.email })).toHaveLength(1);
  });
});

describe('the scheduled sweep', () => {
  test('holds back a reminder owed within the pause after a manual one, and sends it afterwards', async () => {
    const member = fx.members[2];
    const due = new Date(Date.now() + 400 * DAY); // far ahead: the app's own sweep owes it nothing today
    const loanId = await makeLoan(member.id, due);
    const overdueAt = new Date(due.getTime() + 1.5 * DAY);
    // A steward reminded them by hand an hour before the sweep runs.
    await db
      .insertInto('reminders')
      .values({ space_id: fx.space.id, loan_id: loanId, kind: 'manual', for_day: '2000-01-01', status: 'sent', created_at: new Date(overdueAt.getTime() - HOUR), sent_at: new Date(overdueAt.getTime() - HOUR) })
      .execute();

    // (The space's other loans are owed reminders at these instants too: look at this loan's rows only.)
    await runReminderSweep(db, overdueAt, { spaceId: fx.space.id });
    await runReminderSweep(db, new Date(overdueAt.getTime() + (REMINDER_PAUSE_HOURS - 2) * HOUR), { spaceId: fx.space.id });
    expect((await remindersOf(loanId)).map((r) => r.kind)).toEqual(['manual']);
    expect(await listMessages({ to: member.email })).toHaveLength(0);

    await runReminderSweep(db, new Date(overdueAt.getTime() + REMINDER_PAUSE_HOURS * HOUR), { spaceId: fx.space.id });
    expect(await listMessages({ to: member.email })).toHaveLength(1);
    expect((await remindersOf(loanId)).map((r) => [r.kind, r.status])).toEqual([['manual', 'sent'], ['overdue', 'sent']]);
  });
});
