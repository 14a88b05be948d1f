import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type Stripe from 'stripe';
import type { PaymentsFake } from '@/fakes/payments/server';
import { closeTestDb, makeLocation, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeStock, makeUnit, type ErrorBody } from './loans-fixtures';
import { closedPort, ownFake, payOnFake, pointSpaceAt, waitFor } from './sales-fixtures';
import { waitForMessage } from '@/lib/mail/mailbox';

// Deposits and charges through real HTTP, real PostgreSQL and the payments fake (the processor's SDK
// pointed at it, webhooks signed and — chaos — each delivered three times). A kit that asks for a deposit
// is not a loan until the deposit is paid; a steward's confirmed return keeps what is charged and gives
// the rest back exactly once, whoever presses and however often the processor reports it; a charge for
// a damaged part writes off exactly that part and leaves the shelf count right; a charge beyond the
// deposit stays owed, and the "owes more than" rule refuses a new loan with the reason.

const db = testDb();
const DEPOSIT = 5000; // USD minor units (ISO 4217: 2 decimals) → $50.00
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let fake: PaymentsFake;
let stripe: Stripe;
let steward: HttpSession;
let steward2: HttpSession;
let admin: HttpSession;
let alice: HttpSession;
let bruno: HttpSession;
let templateId: string;
let ledBin: string;

type LoanAnswer = {
  loan: { id: string; status: string; deposit: { url: string; amountMinor: number; currency: string } | null };
};
type LoanJson = { loan: { id: string; status: string; lines: { id: string; partId: string; qty: number; unitCode: string | null }[] } };

beforeAll(async () => {
  fx = await loanSpace(db, { members: 2, timeZone: 'UTC' });
  await db.updateTable('spaces').set({ max_open_loans: 50 }).where('id', '=', fx.space.id).execute();
  parts = await chainParts(db, fx.space.id);
  // Enough for every box this file builds (each takes a supply and a driver; a charged damaged driver is retired).
  for (let i = 0; i < 10; i++) {
    await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
    await makeUnit(db, fx.space.id, parts.driver.id, fx.bin.id);
  }
  ledBin = (await makeLocation(db, fx.space.id)).id;
  await makeStock(db, fx.space.id, parts.led.id, ledBin, 30);
  ({ fake, stripe } = await ownFake({ chaos: { duplicate: 3 } }));
  await pointSpaceAt(fx.space.id, fake.port);
  steward = await login(fx.steward);
  steward2 = await login(await makeUser(db, fx.space.id, ['steward'], 'Second steward'));
  admin = await login(await makeUser(db, fx.space.id, ['admin'], 'Deposit admin'));
  [alice, bruno] = await Promise.all(fx.members.map(login));

  const t = await steward.post('/api/kits/templates', {
    name: 'Test bench lamp with deposit',
    depositMinor: DEPOSIT,
    lines: [
      { partId: parts.supply24.id, qty: 1, chainRole: 'supply' },
      { partId: parts.driver.id, qty: 1, chainRole: 'driver' },
      { partId: parts.led.id, qty: 3, chainRole: 'led' },
    ],
  });
  expect(t.status).toBe(201);
  templateId = (await json<{ template: { id: string } }>(t)).template.id;
  const seen = await json<{ template: { depositMinor: number | null } }>(await alice.get(`/api/kits/templates/${templateId}`));
  expect(seen.template.depositMinor).toBe(DEPOSIT);
});
afterAll(async () => {
  if (fx) await pointSpaceAt(fx.space.id, null).catch(() => undefined);
  await fake?.close();
  await closeTestDb();
});

async function newBox(): Promise<string> {
  const b = await steward.post('/api/kits/boxes', { templateId });
  expect(b.status).toBe(201);
  return (await json<{ box: { id: string } }>(b)).box.id;
}
const depositOf = (loanId: string) =>
  db.selectFrom('deposits').selectAll().where('loan_id', '=', loanId).executeTakeFirstOrThrow();
const loanRow = (id: string) => db.selectFrom('loans').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
const ledOnShelf = async () =>
  (await db.selectFrom('stock').select('qty').where('part_id', '=', parts.led.id).where('location_id', '=', ledBin).executeTakeFirstOrThrow()).qty;

/** A member borrows a new box, pays the deposit on the fake, and the webhook makes it a loan. */
async function paidLoan(who: HttpSession) {
  const boxId = await newBox();
  const res = await who.post('/api/loans', { kitBoxId: boxId });
  expect(res.status).toBe(201);
  const { loan } = await json<LoanAnswer>(res);
  const d = await depositOf(loan.id);
  const paid = await payOnFake(fake, d.checkout_session_id!);
  expect(paid.status).toBe(200);
  await waitFor('the deposit to be held', async () => (await depositOf(loan.id)).status === 'held');
  await waitFor('the loan to start', async () => (await loanRow(loan.id)).status === 'out');
  const lines = (await json<LoanJson>(await who.get(`/api/loans/${loan.id}`))).loan.lines;
  return { loanId: loan.id, boxId, lines, pi: (await depositOf(loan.id)).payment_intent_id! };
}

describe('taking the deposit', () => {
  test('a borrow of a kit with a deposit waits, with a pay page, and is a loan only once paid — once, however often told', async () => {
    const boxId = await newBox();
    const res = await alice.post('/api/loans', { kitBoxId: boxId });
    expect(res.status).toBe(201);
    const { loan } = await json<LoanAnswer>(res);
    expect(loan.status).toBe('waiting');
    expect(loan.deposit).toMatchObject({ amountMinor: DEPOSIT, currency: 'USD' });
    expect(loan.deposit!.url).toContain('/pay/');
    const d = await depositOf(loan.id);
    expect(d).toMatchObject({ status: 'pending', amount_minor: DEPOSIT, currency: 'USD', starts_as: 'out' });
    const session = await stripe.checkout.sessions.retrieve(d.checkout_session_id!);
    expect(session.amount_total).toBe(DEPOSIT);
    expect(session.url).toBe(loan.deposit!.url);

    // Not a loan yet: nobody else can take the box, and no steward can hand it over unpaid.
    expect((await bruno.post('/api/loans', { kitBoxId: boxId })).status).toBe(409);
    const early = await steward.post(`/api/loans/${loan.id}/hand-over`);
    expect(early.status).toBe(409);
    expect((await json<ErrorBody>(early)).error.message).toMatch(/deposit is not paid/);
    expect((await alice.post(`/api/loans/${loan.id}/return`, {})).status).toBe(409);

    expect((await payOnFake(fake, d.checkout_session_id!)).status).toBe(200);
    await waitFor('the loan to start', async () => (await loanRow(loan.id)).status === 'out');
    const held = await depositOf(loan.id);
    expect(held.status).toBe('held');
    expect(held.payment_intent_id).toMatch(/^pi_/);
    // Every event went three times: all deliveries answered, the deposit marked paid once.
    await waitFor('every delivery', () => fake.deliveries().every((x) => x.status === 'delivered'));
    const paidRows = await db.selectFrom('audit_log').select('id').where('action', '=', 'deposit.paid').where('target_id', '=', loan.id).execute();
    expect(paidRows).toHaveLength(1);
  });
});

describe('a confirmed return', () => {
  test('a member’s return of a loan with a deposit waits for a steward’s check; the deposit stays held', async () => {
    const { loanId } = await paidLoan(alice);
    const back = await alice.post(`/api/loans/${loanId}/return`, { note: 'All there' });
    expect(back.status).toBe(200);
    expect((await json<{ return: { status: string } }>(back)).return.status).toBe('back_unchecked');
    expect((await depositOf(loanId)).status).toBe('held');
    // A member cannot charge themselves or anyone.
    const lines = (await json<LoanJson>(await alice.get(`/api/loans/${loanId}`))).loan.lines;
    const self = await alice.post(`/api/loans/${loanId}/return`, {
      lines: lines.map((l) => ({ lineId: l.id, returnedQty: l.qty, condition: 'ok', chargeMinor: 1 })),
    });
    expect([403, 409]).toContain(self.status);
  });

  test('short: the charge is kept from the deposit and the rest goes back exactly once, with two stewards at once and duplicate webhooks', async () => {
    const { loanId, lines, pi } = await paidLoan(bruno);
    const led = lines.find((l) => l.partId === parts.led.id)!;
    const body = {
      note: 'One star missing',
      lines: lines.map((l) =>
        l.id === led.id
          ? { lineId: l.id, returnedQty: 2, condition: 'missing', chargeMinor: 1200, chargeNote: 'Lost LED star' }
          : { lineId: l.id, returnedQty: l.qty, condition: 'ok' },
      ),
    };
    const answers = await Promise.all([steward, steward2].map((s) => s.post(`/api/loans/${loanId}/return`, body)));
    expect(answers.map((r) => r.status).sort()).toEqual([200, 409]);
    const ok = await json<{ return: { status: string; depositReleased: boolean } }>(answers.find((r) => r.status === 200)!);
    expect(ok.return.status).toBe('returned_short');

    await waitFor('the deposit to be released', async () => (await depositOf(loanId)).status === 'released');
    const d = await depositOf(loanId);
    expect(d).toMatchObject({ kept_minor: 1200, released_minor: DEPOSIT - 1200 });
    expect(d.refund_id).toMatch(/^re_/);
    // At the processor: exactly one refund of the rest.
    await waitFor('every delivery', () => fake.deliveries().every((x) => x.status === 'delivered'));
    const refunds = await stripe.refunds.list({ payment_intent: pi, limit: 10 });
    expect(refunds.data.map((r) => r.amount)).toEqual([DEPOSIT - 1200]);
    expect(refunds.data[0].metadata?.depositId).toBe(d.id);
    // Pressed again later: nothing more.
    expect((await steward.post(`/api/loans/${loanId}/return`, body)).status).toBe(409);
    expect((await stripe.refunds.list({ payment_intent: pi, limit: 10 })).data).toHaveLength(1);
    const released = await db.selectFrom('audit_log').select('id').where('action', '=', 'deposit.released').where('target_id', '=', loanId).execute();
    expect(released).toHaveLength(1);

    const charges = await db.selectFrom('charges').selectAll().where('loan_id', '=', loanId).execute();
    expect(charges).toHaveLength(1);
    expect(charges[0]).toMatchObject({
      kind: 'missing',
      item: parts.led.name,
      note: 'Lost LED star',
      amount_minor: 1200,
      from_deposit_minor: 1200,
      currency: 'USD',
      user_id: fx.members[1].id,
    });
    // The member is told, in our words: what was charged, what the deposit covered, what goes back.
    const notice = await waitForMessage({
      to: fx.members[1].email,
      timeoutMs: 15_000,
      match: (m) => m.subject.startsWith('Charged at'),
    });
    expect(notice.subject).toMatch(/: \$12\.00$/);
    expect(notice.text).toContain(`${parts.led.name}: $12.00 ($12.00 kept from your deposit)`);
    expect(notice.text).toContain('Your deposit was $50.00; $38.00 of it goes back to your card.');
    expect(notice.text).toContain('Nothing more is owed.');
  });

  test('damaged: a charge beyond the deposit stays owed; the damaged part is written off once and the count stays right', async () => {
    const { loanId, boxId, lines } = await paidLoan(alice);
    const led = lines.find((l) => l.partId === parts.led.id)!;
    const driver = lines.find((l) => l.partId === parts.driver.id)!;
    const driverUnit = await db
      .selectFrom('loan_lines')
      .select('unit_id')
      .where('id', '=', driver.id)
      .executeTakeFirstOrThrow();
    const shelfBefore = await ledOnShelf();
    const salesBefore = await db.selectFrom('sales').select('id').where('space_id', '=', fx.space.id).execute();

    const res = await steward.post(`/api/loans/${loanId}/return`, {
      lines: lines.map((l) =>
        l.id === led.id
          ? { lineId: l.id, returnedQty: 2, condition: 'damaged', chargeMinor: 3000, chargeNote: 'Cracked star' }
          : l.id === driver.id
            ? { lineId: l.id, returnedQty: 0, condition: 'damaged', chargeMinor: 3000, chargeNote: 'Burnt driver' }
            : { lineId: l.id, returnedQty: l.qty, condition: 'ok' },
      ),
    });
    expect(res.status).toBe(200);

    // All the deposit kept, nothing to give back; 10.00 still owed.
    const d = await depositOf(loanId);
    expect(d).toMatchObject({ status: 'released', kept_minor: DEPOSIT, released_minor: 0, refund_id: null });
    expect((await stripe.refunds.list({ payment_intent: d.payment_intent_id!, limit: 10 })).data).toHaveLength(0);
    const charges = await db.selectFrom('charges').select(['amount_minor', 'from_deposit_minor']).where('loan_id', '=', loanId).orderBy('created_at').execute();
    expect(charges.reduce((s, c) => s + c.amount_minor - c.from_deposit_minor, 0)).toBe(6000 - DEPOSIT);
    const notice = await waitForMessage({
      to: fx.members[0].email,
      timeoutMs: 15_000,
      match: (m) => m.subject.startsWith('Charged at') && m.text.includes('Still owed'),
    });
    expect(notice.text).toContain('Still owed: $10.00. Settle it with a steward at the bench.');

    // The damaged LED: exactly one written off from the box, the shelf's count untouched, no counter sale.
    const moves = await db
      .selectFrom('stock_movements')
      .select(['part_id', 'qty_delta', 'reason', 'location_id', 'unit_id'])
      .where('ref_type', '=', 'loan')
      .where('ref_id', '=', loanId)
      .where('reason', 'in', ['lost', 'damaged'])
      .orderBy('part_id')
      .execute();
    expect(moves.filter((m) => m.part_id === parts.led.id)).toEqual([
      { part_id: parts.led.id, qty_delta: -1, reason: 'damaged', location_id: null, unit_id: null },
    ]);
    expect(moves.filter((m) => m.part_id === parts.driver.id)).toEqual([
      { part_id: parts.driver.id, qty_delta: 0, reason: 'damaged', location_id: null, unit_id: driverUnit.unit_id },
    ]);
    const content = await db.selectFrom('kit_box_contents').select('qty').where('kit_box_id', '=', boxId).where('part_id', '=', parts.led.id).executeTakeFirstOrThrow();
    expect(content.qty).toBe(2);
    expect(await ledOnShelf()).toBe(shelfBefore);
    // The charged driver is written off (paid for), not queued for repair, and out of the box.
    const unit = await db.selectFrom('units').select(['state', 'kit_box_id']).where('id', '=', driverUnit.unit_id!).executeTakeFirstOrThrow();
    expect(unit).toEqual({ state: 'retired', kit_box_id: null });
    const salesAfter = await db.selectFrom('sales').select('id').where('space_id', '=', fx.space.id).execute();
    expect(salesAfter).toHaveLength(salesBefore.length);
  });

  test('a charge on a line that came back whole is refused, naming the field', async () => {
    const { loanId, lines } = await paidLoan(bruno);
    const res = await steward.post(`/api/loans/${loanId}/return`, {
      lines: lines.map((l, i) => ({ lineId: l.id, returnedQty: l.qty, condition: 'ok', ...(i === 0 ? { chargeMinor: 100 } : {}) })),
    });
    expect(res.status).toBe(400);
    expect((await json<ErrorBody>(res)).error.fields).toHaveProperty(['lines.0.chargeMinor']);
    expect((await depositOf(loanId)).status).toBe('held');
    // A complete return gives all of it back.
    const full = await steward.post(`/api/loans/${loanId}/return`, {});
    expect(full.status).toBe(200);
    await waitFor('the deposit to be released', async () => (await depositOf(loanId)).status === 'released');
    const d = await depositOf(loanId);
    expect(d).toMatchObject({ kept_minor: 0, released_minor: DEPOSIT });
    expect((await stripe.refunds.list({ payment_intent: d.payment_intent_id!, limit: 10 })).data.map((r) => r.amount)).toEqual([DEPOSIT]);
  });
});

describe('when the processor does not answer', () => {
  test('the deposit waits to go back; sending it again gives back one refund, however many press', async () => {
    const { loanId, pi } = await paidLoan(bruno);
    await pointSpaceAt(fx.space.id, await closedPort());
    try {
      const res = await steward.post(`/api/loans/${loanId}/return`, {});
      expect(res.status).toBe(200);
      expect((await json<{ return: { depositReleased: boolean } }>(res)).return.depositReleased).toBe(false);
      expect((await depositOf(loanId)).status).toBe('releasing');
      const down = await steward.post(`/api/loans/${loanId}/deposit-release`);
      expect(down.status).toBe(503);
      expect((await json<ErrorBody>(down)).error.message).toMatch(/still waits to go back/);
    } finally {
      await pointSpaceAt(fx.space.id, fake.port);
    }
    expect((await bruno.post(`/api/loans/${loanId}/deposit-release`)).status).toBe(403);
    const again = await Promise.all([steward, steward2, steward].map((s) => s.post(`/api/loans/${loanId}/deposit-release`)));
    const statuses = again.map((r) => r.status);
    expect(statuses.every((st) => st === 200 || st === 409)).toBe(true);
    expect(statuses).toContain(200);
    await waitFor('the deposit to be released', async () => (await depositOf(loanId)).status === 'released');
    await waitFor('every delivery', () => fake.deliveries().every((x) => x.status === 'delivered'));
    expect((await stripe.refunds.list({ payment_intent: pi, limit: 10 })).data.map((r) => r.amount)).toEqual([DEPOSIT]);
    const settled = await steward.post(`/api/loans/${loanId}/deposit-release`);
    expect(settled.status).toBe(409);
    expect((await json<ErrorBody>(settled)).error.message).toBe('The deposit is settled already.');
  });
});

describe('owes more than', () => {
  test('a member owing over the limit is refused with the amount and the limit; at or under it they may borrow', async () => {
    // Alice owes 10.00 (the damaged return above).
    expect((await admin.post('/api/settings/borrowing', { refuseWhenOwingOverMinor: 999 }, 'PATCH')).status).toBe(200);
    const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const refused = await alice.post('/api/loans', { unitIds: [meter.id] });
    expect(refused.status).toBe(409);
    const body = await json<ErrorBody>(refused);
    expect(body.error.message).toBe(
      'You owe $10.00 in charges, more than this space allows ($9.99). No new loan until what is owed is $9.99 or less: settling it with a steward clears it.',
    );
    expect(body.error.fields?.borrowerId?.[0]).toMatch(/owes \$10\.00/);
    // A steward lending to her is refused too, in the third person.
    const onBehalf = await steward.post('/api/loans', { unitIds: [meter.id], borrowerId: fx.members[0].id });
    expect(onBehalf.status).toBe(409);
    expect((await json<ErrorBody>(onBehalf)).error.message).toMatch(/^This member owes \$10\.00/);
    // Bruno owes nothing beyond his deposits: he may borrow.
    expect((await bruno.post('/api/loans', { unitIds: [meter.id] })).status).toBe(201);

    // Cash paid to a steward settles it: never more than is owed, never twice under two stewards at once.
    const settle = (who: HttpSession, amountMinor: number) =>
      who.post(`/api/people/${fx.members[0].id}/settle-charges`, { amountMinor });
    const tooMuch = await settle(steward, 1001);
    expect(tooMuch.status).toBe(400);
    expect((await json<ErrorBody>(tooMuch)).error.fields).toEqual({ amountMinor: ['at most 1000'] });
    expect((await settle(alice, 1)).status).toBe(403);
    const both = await Promise.all([settle(steward, 600), settle(steward2, 600)]);
    expect(both.map((r) => r.status).sort()).toEqual([200, 400]);
    const paid = await json<{ settled: { owedMinor: number } }>(both.find((r) => r.status === 200)!);
    expect(paid.settled.owedMinor).toBe(400);
    const settledAudit = await db.selectFrom('audit_log').select('detail').where('action', '=', 'charge.settled').where('target_id', '=', fx.members[0].id).execute();
    expect(settledAudit).toHaveLength(1);
    // Now under the limit: she may borrow again.
    const meter2 = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    expect((await alice.post('/api/loans', { unitIds: [meter2.id] })).status).toBe(201);
    const bad = await admin.post('/api/settings/borrowing', { refuseWhenOwingOverMinor: 1.5 }, 'PATCH');
    expect(bad.status).toBe(400);
    expect((await json<ErrorBody>(bad)).error.fields).toHaveProperty(['refuseWhenOwingOverMinor']);
    expect((await admin.post('/api/settings/borrowing', { refuseWhenOwingOverMinor: null }, 'PATCH')).status).toBe(200);
  });
});

describe('giving up a waiting borrow', () => {
  test('the member gives up before paying: the box is back, the deposit ends, its pay page closes', async () => {
    const boxId = await newBox();
    const { loan } = await json<LoanAnswer>(await alice.post('/api/loans', { kitBoxId: boxId }));
    const d = await depositOf(loan.id);
    expect((await bruno.post(`/api/loans/${loan.id}/cancel`)).status).toBe(404);
    const res = await alice.post(`/api/loans/${loan.id}/cancel`);
    expect(res.status).toBe(200);
    expect((await loanRow(loan.id)).status).toBe('cancelled');
    expect((await depositOf(loan.id)).status).toBe('ended');
    const box = await db.selectFrom('kit_boxes').select('state').where('id', '=', boxId).executeTakeFirstOrThrow();
    expect(box.state).toBe('on_shelf');
    const units = await db.selectFrom('units').select('state').where('kit_box_id', '=', boxId).execute();
    expect(units.every((u) => u.state === 'on_shelf')).toBe(true);
    expect((await stripe.checkout.sessions.retrieve(d.checkout_session_id!)).status).toBe('expired');
    expect((await alice.post(`/api/loans/${loan.id}/cancel`)).status).toBe(409);
    // Someone else may borrow it now.
    expect((await bruno.post('/api/loans', { kitBoxId: boxId })).status).toBe(201);
  });

  test('a loose borrow waiting at the bench: counted parts go back into their bin', async () => {
    expect((await admin.post('/api/settings/borrowing', { presence: 'bench_handover' }, 'PATCH')).status).toBe(200);
    try {
      const before = await ledOnShelf();
      const res = await bruno.post('/api/loans', { counted: [{ partId: parts.led.id, locationId: ledBin, qty: 2 }] });
      expect(res.status).toBe(201);
      const { loan } = await json<LoanAnswer>(res);
      expect(loan.status).toBe('waiting');
      expect(await ledOnShelf()).toBe(before - 2);
      expect((await bruno.post(`/api/loans/${loan.id}/cancel`)).status).toBe(200);
      expect(await ledOnShelf()).toBe(before);
      const audit = await db.selectFrom('audit_log').select('detail').where('action', '=', 'loan.cancelled').where('target_id', '=', loan.id).execute();
      expect(audit).toHaveLength(1);
      // A loan that is out cannot be given up: it is returned.
      const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
      const lent = await json<LoanAnswer>(await steward.post('/api/loans', { unitIds: [meter.id], borrowerId: fx.members[1].id }));
      expect(lent.loan.status).toBe('out');
      expect((await bruno.post(`/api/loans/${lent.loan.id}/cancel`)).status).toBe(409);
    } finally {
      await admin.post('/api/settings/borrowing', { presence: 'self_service' }, 'PATCH');
    }
  });
});
