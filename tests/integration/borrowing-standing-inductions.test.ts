import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeLocation, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeStock, makeUnit, type ErrorBody, type TestUser } from './loans-fixtures';

// Who may borrow, through real HTTP against real PostgreSQL: a member with a loan past due starts no
// new one (by the kit's page, by a typed code, or through a steward), until it is back or the admin
// turns the rule off; inductions a kit template or part category needs are checked against current,
// unexpired, unwithdrawn sign-offs, and a steward's override names the gate it overrides.

const db = testDb();
const DAY = 86_400_000;
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let admin: HttpSession;
let steward: HttpSession;
let member: HttpSession[];
let people: TestUser[];
let ledBin: string;

beforeAll(async () => {
  fx = await loanSpace(db, { members: 6, timeZone: 'UTC' });
  parts = await chainParts(db, fx.space.id);
  const a = await makeUser(db, fx.space.id, ['admin'], 'Rules admin');
  admin = await login(a);
  steward = await login(fx.steward);
  people = fx.members;
  ledBin = (await makeLocation(db, fx.space.id)).id;
  await makeStock(db, fx.space.id, parts.led.id, ledBin, 30);
  member = await Promise.all(people.map(login));
});
afterAll(closeTestDb);

/** A loan of `userId`'s, out since 10 days and due `dueInDays` from now (negative: overdue). */
async function loanDue(userId: string, dueInDays: number) {
  const unit = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
  await db.updateTable('units').set({ state: 'out' }).where('id', '=', unit.id).execute();
  const loan = await db
    .insertInto('loans')
    .values({
      space_id: fx.space.id,
      borrower_id: userId,
      lent_by_id: fx.steward.id,
      out_at: new Date(Date.now() - 10 * DAY),
      due_at: new Date(Date.now() + dueInDays * DAY),
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('loan_lines')
    .values({ loan_id: loan.id, space_id: fx.space.id, part_id: parts.meter.id, unit_id: unit.id, qty: 1 })
    .execute();
  return { loanId: loan.id, unit };
}

const freeMeter = () => makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);

describe('standing', () => {
  test('a member with a loan four days overdue is refused a new loan, saying why and what clears it', async () => {
    const { loanId, unit } = await loanDue(people[0].id, -4);
    const meter = await freeMeter();
    const res = await member[0].post('/api/loans', { unitIds: [meter.id] });
    expect(res.status).toBe(409);
    const body = await json<ErrorBody>(res);
    expect(body.error.message).toMatch(/You have a loan past the due date: Test multimeter \(due /);
    expect(body.error.message).toMatch(/No new loan until it is back, or a steward renews it/);
    expect(body.error.fields).toEqual({ borrowerId: ['1 overdue loan'] });
    // Nothing was taken.
    expect((await db.selectFrom('units').select('state').where('id', '=', meter.id).executeTakeFirstOrThrow()).state).toBe(
      'on_shelf',
    );

    // Typing the meter's label code from home: the code resolves, the borrow is refused the same way.
    const scanned = await member[0].get(`/api/scan/${meter.code}`);
    expect(scanned.status).toBe(200);
    const target = await json<{ targetId: string; kind: string }>(scanned);
    expect(target).toMatchObject({ kind: 'unit', targetId: meter.id });
    const byCode = await member[0].post('/api/loans', { unitIds: [target.targetId] });
    expect(byCode.status).toBe(409);
    expect((await json<ErrorBody>(byCode)).error.message).toMatch(/past the due date/);

    // A steward lending on their behalf is refused too, in the third person.
    const onBehalf = await steward.post('/api/loans', { unitIds: [meter.id], borrowerId: people[0].id });
    expect(onBehalf.status).toBe(409);
    expect((await json<ErrorBody>(onBehalf)).error.message).toMatch(/^This member has a loan past the due date/);

    // The preview says so before anyone presses the button.
    const preview = await member[0].post('/api/loans/preview', { unitIds: [meter.id] });
    const p = await json<{ preview: { available: boolean; unavailable: string[] } }>(preview);
    expect(p.preview.available).toBe(false);
    expect(p.preview.unavailable.join(' ')).toMatch(/past the due date/);

    // Back on the shelf (returned through the service): the member borrows again.
    const back = await steward.post(`/api/loans/${loanId}/return`, {});
    expect(back.status).toBe(200);
    expect((await db.selectFrom('units').select('state').where('id', '=', unit.id).executeTakeFirstOrThrow()).state).toBe(
      'on_shelf',
    );
    expect((await member[0].post('/api/loans', { unitIds: [meter.id] })).status).toBe(201);
  });

  test('a loan not yet due does not count against standing', async () => {
    await loanDue(people[1].id, 2);
    const meter = await freeMeter();
    expect((await member[1].post('/api/loans', { unitIds: [meter.id] })).status).toBe(201);
  });

  test('the admin turns the rule off in Settings; members and stewards cannot', async () => {
    await loanDue(people[2].id, -1);
    const meter = await freeMeter();
    expect((await member[2].post('/api/loans', { unitIds: [meter.id] })).status).toBe(409);

    expect((await steward.post('/api/settings/borrowing', { refuseWhileOverdue: false }, 'PATCH')).status).toBe(403);
    const off = await admin.post('/api/settings/borrowing', { refuseWhileOverdue: false }, 'PATCH');
    expect(off.status).toBe(200);
    expect((await json<{ rules: { refuseWhileOverdue: boolean } }>(off)).rules.refuseWhileOverdue).toBe(false);
    const audit = await db
      .selectFrom('audit_log')
      .select('detail')
      .where('space_id', '=', fx.space.id)
      .where('action', '=', 'borrowing_rules.updated')
      .executeTakeFirstOrThrow();
    expect(audit.detail).toEqual({ changed: { refuseWhileOverdue: { from: true, to: false } } });

    expect((await member[2].post('/api/loans', { unitIds: [meter.id] })).status).toBe(201);
    expect((await admin.post('/api/settings/borrowing', { refuseWhileOverdue: true }, 'PATCH')).status).toBe(200);
  });

  test('bad rules are a 400 naming the field, and change nothing', async () => {
    const before = await json<{ rules: unknown }>(await admin.get('/api/settings/borrowing'));
    const zero = await admin.post('/api/settings/borrowing', { reminderPauseHours: 0 }, 'PATCH');
    expect(zero.status).toBe(400);
    expect((await json<ErrorBody>(zero)).error.fields).toHaveProperty(['reminderPauseHours']);
    const week = {
      mon: { opens: '18:00', closes: '10:00' },
      tue: null,
      wed: null,
      thu: null,
      fri: null,
      sat: null,
      sun: null,
    };
    const backwards = await admin.post('/api/settings/borrowing', { week }, 'PATCH');
    expect(backwards.status).toBe(400);
    expect((await json<ErrorBody>(backwards)).error.fields).toHaveProperty(['week.mon.closes']);
    const noDay = await admin.post('/api/settings/borrowing', { closedDates: ['2026-02-30'] }, 'PATCH');
    expect(noDay.status).toBe(400);
    expect((await json<ErrorBody>(noDay)).error.fields).toHaveProperty(['closedDates.0']);
    const unknown = await admin.post('/api/settings/borrowing', { presence: 'somewhere' }, 'PATCH');
    expect(unknown.status).toBe(400);
    expect((await json<ErrorBody>(unknown)).error.fields).toHaveProperty(['presence']);
    expect(await json<{ rules: unknown }>(await admin.get('/api/settings/borrowing'))).toEqual(before);
  });
});

describe('inductions', () => {
  let inductionId: string;
  let templateId: string;

  test('a steward defines an induction needed by a kit template and by a part category; a member cannot', async () => {
    const t = await steward.post('/api/kits/templates', {
      name: 'Test 24 V lamp',
      lines: [
        { partId: parts.supply24.id, qty: 1, chainRole: 'supply' },
        { partId: parts.driver.id, qty: 1, chainRole: 'driver' },
        { partId: parts.led.id, qty: 3, chainRole: 'led' },
      ],
    });
    expect(t.status).toBe(201);
    templateId = (await json<{ template: { id: string } }>(t)).template.id;

    expect((await member[3].post('/api/inductions', { name: 'Nope' })).status).toBe(403);
    const res = await steward.post('/api/inductions', {
      name: 'Supplies above 12 V',
      description: 'Switch off and let it settle before touching the output.',
      templateIds: [templateId],
      categories: ['supply'],
    });
    expect(res.status).toBe(201);
    const { induction } = await json<{ induction: { id: string; templates: { id: string }[]; categories: string[] } }>(res);
    inductionId = induction.id;
    expect(induction.templates.map((x) => x.id)).toEqual([templateId]);
    expect(induction.categories).toEqual(['supply']);

    const dup = await steward.post('/api/inductions', { name: 'supplies ABOVE 12 v' });
    expect(dup.status).toBe(409);
    expect((await json<ErrorBody>(dup)).error.fields).toHaveProperty(['name']);
    const foreign = await steward.post('/api/inductions', { name: 'Other', templateIds: [fx.space.id] });
    expect(foreign.status).toBe(400);
    expect((await json<ErrorBody>(foreign)).error.fields).toHaveProperty(['templateIds.0']);
  });

  test('a borrow without the sign-off is refused naming what is missing and whom to ask; nothing is taken', async () => {
    const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    const res = await member[3].post('/api/loans', { unitIds: [supply.id] });
    expect(res.status).toBe(409);
    const body = await json<ErrorBody>(res);
    expect(body.error.message).toMatch(/You need an induction first: “Supplies above 12 V” \(needed for DC supply parts; no sign-off yet\)/);
    expect(body.error.message).toMatch(/Ask a steward to sign you off: Test steward\./);
    expect(body.error.fields?.inductions).toEqual(['Supplies above 12 V: not signed off']);
    expect((await db.selectFrom('units').select('state').where('id', '=', supply.id).executeTakeFirstOrThrow()).state).toBe(
      'on_shelf',
    );
    // Parts no induction covers are lent as before.
    expect((await member[3].post('/api/loans', { unitIds: [(await freeMeter()).id] })).status).toBe(201);
  });

  test('a kit box of a template that needs it is refused the same way', async () => {
    for (const p of [parts.supply24.id, parts.driver.id]) await makeUnit(db, fx.space.id, p, fx.bin.id);
    const b = await steward.post('/api/kits/boxes', { templateId });
    expect(b.status).toBe(201);
    const boxId = (await json<{ box: { id: string } }>(b)).box.id;
    const res = await member[4].post('/api/loans', { kitBoxId: boxId });
    expect(res.status).toBe(409);
    expect((await json<ErrorBody>(res)).error.message).toMatch(
      /“Supplies above 12 V” \(needed for the kit “Test 24 V lamp” and DC supply parts; no sign-off yet\)/,
    );
    expect((await db.selectFrom('kit_boxes').select('state').where('id', '=', boxId).executeTakeFirstOrThrow()).state).toBe(
      'on_shelf',
    );
  });

  test('signed off (who, when, expiry, note; audited): the member borrows; members see only their own', async () => {
    expect((await member[0].post(`/api/inductions/${inductionId}/signoffs`, { userId: people[3].id })).status).toBe(403);
    const badDay = await steward.post(`/api/inductions/${inductionId}/signoffs`, { userId: people[3].id, expiresOn: '2026-13-01' });
    expect(badDay.status).toBe(400);
    expect((await json<ErrorBody>(badDay)).error.fields).toHaveProperty(['expiresOn']);
    const past = await steward.post(`/api/inductions/${inductionId}/signoffs`, { userId: people[3].id, expiresOn: '2020-01-01' });
    expect(past.status).toBe(400);
    expect((await json<ErrorBody>(past)).error.fields).toHaveProperty(['expiresOn']);

    const res = await steward.post(`/api/inductions/${inductionId}/signoffs`, {
      userId: people[3].id,
      expiresOn: '2099-06-30',
      note: 'Showed the discharge routine.',
    });
    expect(res.status).toBe(201);
    const { signoff } = await json<{ signoff: { id: string; signedBy: string; expiresAt: string; note: string; current: boolean } }>(res);
    expect(signoff).toMatchObject({ signedBy: 'Test steward', note: 'Showed the discharge routine.', current: true });
    // Valid through the whole of that day in the space's zone (UTC here).
    expect(signoff.expiresAt).toBe('2099-07-01T00:00:00.000Z');
    const audit = await db
      .selectFrom('audit_log')
      .select(['actor_id', 'detail'])
      .where('action', '=', 'induction.signed_off')
      .where('target_id', '=', signoff.id)
      .executeTakeFirstOrThrow();
    expect(audit.actor_id).toBe(fx.steward.id);

    const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    expect((await member[3].post('/api/loans', { unitIds: [supply.id] })).status).toBe(201);

    const mine = await json<{ signoffs: { userId: string; induction: string }[] }>(
      await member[3].get('/api/signoffs'),
    );
    expect(mine.signoffs.map((s) => s.induction)).toEqual(['Supplies above 12 V']);
    // Asking for someone else's still answers with one's own.
    const other = await json<{ signoffs: { userId: string }[] }>(await member[4].get(`/api/signoffs?userId=${people[3].id}`));
    expect(other.signoffs).toEqual([]);
    const asSteward = await json<{ signoffs: { userId: string }[] }>(await steward.get(`/api/signoffs?userId=${people[3].id}`));
    expect(asSteward.signoffs.map((s) => s.userId)).toEqual([people[3].id]);
  });

  test('an expired sign-off is refused, saying when it ran out; a withdrawn one counts as none', async () => {
    await db
      .insertInto('induction_signoffs')
      .values({
        space_id: fx.space.id,
        induction_id: inductionId,
        user_id: people[5].id,
        signed_by: fx.steward.id,
        signed_at: new Date('2025-01-10T12:00:00Z'),
        expires_at: new Date('2025-06-01T00:00:00Z'),
      })
      .execute();
    const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    const res = await member[5].post('/api/loans', { unitIds: [supply.id] });
    expect(res.status).toBe(409);
    const body = await json<ErrorBody>(res);
    expect(body.error.message).toMatch(/sign-off ran out on 1 Jun 2025/);
    expect(body.error.fields?.inductions).toEqual(['Supplies above 12 V: sign-off expired']);

    const fresh = await json<{ signoff: { id: string } }>(
      await steward.post(`/api/inductions/${inductionId}/signoffs`, { userId: people[5].id }),
    );
    const withdrawn = await steward.post(`/api/signoffs/${fresh.signoff.id}`, undefined, 'DELETE');
    expect(withdrawn.status).toBe(200);
    expect((await steward.post(`/api/signoffs/${fresh.signoff.id}`, undefined, 'DELETE')).status).toBe(409);
    expect((await member[5].post('/api/loans', { unitIds: [supply.id] })).status).toBe(409);
  });

  test('a steward override names the gate: overriding the check does not pass the induction gate', async () => {
    const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    const checkOnly = await steward.post('/api/loans', {
      unitIds: [supply.id],
      borrowerId: people[4].id,
      override: { gate: 'check', reason: 'Not the check that stops this' },
    });
    expect(checkOnly.status).toBe(409);
    expect((await json<ErrorBody>(checkOnly)).error.message).toMatch(/^This member needs an induction first/);

    const noReason = await steward.post('/api/loans', {
      unitIds: [supply.id],
      borrowerId: people[4].id,
      override: { gate: 'inductions', reason: ' ' },
    });
    expect(noReason.status).toBe(400);
    expect((await json<ErrorBody>(noReason)).error.fields).toHaveProperty(['override.reason']);
    const badGate = await steward.post('/api/loans', {
      unitIds: [supply.id],
      borrowerId: people[4].id,
      override: [{ gate: 'inductions', reason: 'a' }, { gate: 'everything', reason: 'b' }],
    });
    expect(badGate.status).toBe(400);
    expect((await json<ErrorBody>(badGate)).error.fields).toHaveProperty(['override.1.gate']);

    const byMember = await member[4].post('/api/loans', {
      unitIds: [supply.id],
      override: { gate: 'inductions', reason: 'I know how' },
    });
    expect(byMember.status).toBe(403);

    const ok = await steward.post('/api/loans', {
      unitIds: [supply.id],
      borrowerId: people[4].id,
      override: { gate: 'inductions', reason: 'Shown at the bench today; sign-off to follow' },
    });
    expect(ok.status).toBe(201);
    const { loan } = await json<{ loan: { id: string; inductionsOverridden: string[]; overridden: boolean } }>(ok);
    expect(loan.inductionsOverridden).toEqual(['Supplies above 12 V']);
    expect(loan.overridden).toBe(false);
    const row = await db
      .selectFrom('loans')
      .select(['induction_override_reason', 'induction_override_by', 'override_reason'])
      .where('id', '=', loan.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({
      induction_override_reason: 'Shown at the bench today; sign-off to follow',
      induction_override_by: fx.steward.id,
      override_reason: null,
    });
    const audit = await db
      .selectFrom('audit_log')
      .select('detail')
      .where('action', '=', 'loan.override')
      .where('target_id', '=', loan.id)
      .executeTakeFirstOrThrow();
    expect(audit.detail).toEqual({
      gate: 'inductions',
      reason: 'Shown at the bench today; sign-off to follow',
      missing: ['Supplies above 12 V'],
    });
  });

  test('an archived induction is no longer required', async () => {
    const res = await steward.post(`/api/inductions/${inductionId}`, { archived: true }, 'PATCH');
    expect(res.status).toBe(200);
    const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    expect((await member[5].post('/api/loans', { unitIds: [supply.id] })).status).toBe(201);
  });
});
