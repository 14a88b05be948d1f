import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { computeDueAt } from '@/lib/loans/due';
import { listMessages } from '@/lib/mail/mailbox';
import { closeMailTransports } from '@/lib/mail/send';
import { runReminderSweep } from '@/lib/reminders/sweep';
import { closeTestDb, makeLocation, makePart, makeUnit, testDb } from '../helpers/db';
import { loanSpace } from './loans-fixtures';

// The reminder sweep against real PostgreSQL and the real SMTP sink. Loans are due far in the future
// (so the app's own scheduled sweep, running on today's clock, owes them nothing); the sweep is run
// here "at" chosen instants. Run twice, or after a crash between recording and sending, each
// reminder reaches the borrower exactly once, listing the loan's lines.

const db = testDb();
const DAY = 86_400_000;
let fx: Awaited<ReturnType<typeof loanSpace>>;
let supplyName: string;
let ledName: string;
let unitCode: string;

async function makeLoan(borrowerId: string, dueAt: Date) {
  const supply = await makePart(db, fx.space.id, {
    name: `Reminder test supply ${borrowerId.slice(0, 4)}`,
    category: 'supply',
    tracking: 'unit',
    specs: { volts: 24, maxAmps: 1 },
  });
  const led = await makePart(db, fx.space.id, {
    name: `Reminder test LED ${borrowerId.slice(0, 4)}`,
    category: 'led',
    tracking: 'counted',
    specs: {},
  });
  const unit = await makeUnit(db, fx.space.id, supply.id, null);
  const bin = await makeLocation(db, fx.space.id);
  const loan = await db
    .insertInto('loans')
    .values({
      space_id: fx.space.id,
      borrower_id: borrowerId,
      lent_by_id: fx.steward.id,
      out_at: new Date(dueAt.getTime() - 7 * DAY),
      due_at: dueAt,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('loan_lines')
    .values([
      {
        loan_id: loan.id,
        space_id: fx.space.id,
        part_id: supply.id,
        unit_id: unit.id,
        qty: 1,
        chain_role: 'supply',
      },
      {
        loan_id: loan.id,
        space_id: fx.space.id,
        part_id: led.id,
        location_id: bin.id,
        qty: 4,
        chain_role: 'led',
      },
    ])
    .execute();
  await db.updateTable('units').set({ state: 'out' }).where('id', '=', unit.id).execute();
  supplyName = supply.name;
  ledName = led.name;
  unitCode = unit.code;
  return loan.id;
}

/** 18:00 Berlin time, `days` from today: a due time well inside its local day. */
const dueIn = (days: number) =>
  computeDueAt(new Date(Date.now() + days * DAY), {
    loanDays: 0,
    closingTime: '18:00',
    timeZone: 'Europe/Berlin',
  });

const mailsTo = (email: string) => listMessages({ to: email });
const remindersOf = (loanId: string) =>
  db
    .selectFrom('reminders')
    .select(['kind', 'for_day', 'status'])
    .where('loan_id', '=', loanId)
    .orderBy('for_day')
    .execute();

beforeAll(async () => {
  fx = await loanSpace(db, { timeZone: 'Europe/Berlin', members: 3 });
  await db
    .updateTable('spaces')
    .set({ reminder_days_before: 2, reminder_every_days: 3 })
    .where('id', '=', fx.space.id)
    .execute();
});
afterAll(async () => {
  closeMailTransports();
  await closeTestDb();
});

describe('reminder sweep', () => {
  test('run twice, each reminder is sent once, with the loan lines', async () => {
    const member = fx.members[0];
    const due = dueIn(400);
    const loanId = await makeLoan(member.id, due);
    const overdueAt = new Date(due.getTime() + 1.5 * DAY);

    const first = await runReminderSweep(db, overdueAt, { spaceId: fx.space.id });
    expect(first.queued).toBe(1);
    await runReminderSweep(db, overdueAt, { spaceId: fx.space.id });
    await runReminderSweep(db, new Date(overdueAt.getTime() + 3_600_000), { spaceId: fx.space.id });

    const mails = await mailsTo(member.email);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toMatch(/^Overdue:/);
    expect(mails[0].text).toContain(supplyName);
    expect(mails[0].text).toContain(`label ${unitCode}`);
    expect(mails[0].text).toContain(`4 × ${ledName}`);
    expect(mails[0].text).toContain(`/loans/${loanId}`);
    expect((await remindersOf(loanId)).map((r) => [r.kind, r.status])).toEqual([['overdue', 'sent']]);
    const audit = await db
      .selectFrom('audit_log')
      .select('action')
      .where('target_id', '=', loanId)
      .where('action', '=', 'reminder.sent')
      .execute();
    expect(audit).toHaveLength(1);

    // Three days later the next overdue reminder is owed: one more, not a repeat.
    await runReminderSweep(db, new Date(overdueAt.getTime() + 3 * DAY), { spaceId: fx.space.id });
    expect(await mailsTo(member.email)).toHaveLength(2);
    expect((await remindersOf(loanId)).map((r) => r.status)).toEqual(['sent', 'sent']);
  });

  test('a crash between recording and sending: the next run sends it, once', async () => {
    const member = fx.members[1];
    const due = dueIn(500);
    const loanId = await makeLoan(member.id, due);
    const beforeAt = new Date(due.getTime() - 1.5 * DAY); // inside the two-day warning

    // The process dies while sending: the reminder stays recorded as pending, nothing went out.
    const crash = () => Promise.reject(new Error('process killed mid-send'));
    await expect(runReminderSweep(db, beforeAt, { spaceId: fx.space.id, send: crash })).rejects.toThrow(
      'process killed',
    );
    expect((await remindersOf(loanId)).map((r) => [r.kind, r.status])).toEqual([['before_due', 'pending']]);
    expect(await mailsTo(member.email)).toHaveLength(0);

    await runReminderSweep(db, beforeAt, { spaceId: fx.space.id });
    await runReminderSweep(db, beforeAt, { spaceId: fx.space.id });
    const mails = await mailsTo(member.email);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toMatch(/^Due soon:/);
    expect(mails[0].text).toContain(`4 × ${ledName}`);
    expect((await remindersOf(loanId)).map((r) => [r.kind, r.status])).toEqual([['before_due', 'sent']]);
  });

  test('two sweeps at once send each reminder once; a returned loan is not reminded', async () => {
    const member = fx.members[2];
    const due = dueIn(600);
    const loanId = await makeLoan(member.id, due);
    const dueDayAt = new Date(due.getTime() - 60_000);
    await Promise.all([1, 2, 3, 4].map(() => runReminderSweep(db, dueDayAt, { spaceId: fx.space.id })));
    expect(await mailsTo(member.email)).toHaveLength(1);

    await db
      .updateTable('loans')
      .set({ status: 'returned', returned_at: new Date() })
      .where('id', '=', loanId)
      .execute();
    await runReminderSweep(db, new Date(due.getTime() + 2 * DAY), { spaceId: fx.space.id });
    expect(await mailsTo(member.email)).toHaveLength(1);
  });
});
