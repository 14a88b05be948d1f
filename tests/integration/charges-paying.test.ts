import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import Papa from 'papaparse';
import type Stripe from 'stripe';
import type { PaymentsFake } from '@/fakes/payments/server';
import { runDepositReleaseRetry } from '@/lib/deposits/jobs';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeUser, testDb } from '../helpers/db';
import { BASE, type HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeUnit, type ErrorBody } from './loans-fixtures';
import { closedPort, ownFake, payOnFake, pointSpaceAt, stripeOn, waitFor } from './sales-fixtures';

// What is left of issue 16, through real HTTP, real PostgreSQL and the payments fake (webhooks signed,
// each delivered three times): paying what one owes by card on the sales' rules (only the session
// Ohmstead opened, its exact amount and currency, settled once), the treasurer's month of charges and
// deposits (page, filing CSV, reconciliation), late fees counted on the opening calendar, and the
// scheduled retry of a deposit release the processor did not take.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let fake: PaymentsFake;
let stripe: Stripe;
let steward: HttpSession;
let admin: HttpSession;
let treasurer: HttpSession;
let alice: HttpSession;
let bruno: HttpSession;
const month = new Date().toISOString().slice(0, 7); // the space runs on UTC

type Paying = { payment: { paymentId: string; amountMinor: number; currency: string; url: string } };
type LoanJson = { loan: { id: string; lines: { id: string; qty: number }[] } };

beforeAll(async () => {
  fx = await loanSpace(db, { members: 2, timeZone: 'UTC' });
  await db.updateTable('spaces').set({ max_open_loans: 50 }).where('id', '=', fx.space.id).execute();
  parts = await chainParts(db, fx.space.id);
  ({ fake, stripe } = await ownFake({ chaos: { duplicate: 3 } }));
  await pointSpaceAt(fx.space.id, fake.port);
  steward = await login(fx.steward);
  admin = await login(await makeUser(db, fx.space.id, ['admin'], 'Charges admin'));
  treasurer = await login(await makeUser(db, fx.space.id, ['treasurer'], 'Charges treasurer'));
  [alice, bruno] = await Promise.all(fx.members.map(login));
});
afterAll(async () => {
  if (fx) await pointSpaceAt(fx.space.id, null).catch(() => undefined);
  await fetch(`${BASE}/api/test/clock`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ offsetMs: 0 }) });
  await fake?.close();
  await closeTestDb();
});

/** A steward lends a meter to the member; it comes back broken and is charged: all of it owed (no deposit). */
async function owe(memberIndex: number, amountMinor: number): Promise<string> {
  const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
  const lent = await steward.post('/api/loans', { unitIds: [meter.id], borrowerId: fx.members[memberIndex].id });
  expect(lent.status).toBe(201);
  const loanId = (await json<{ loan: { id: string } }>(lent)).loan.id;
  const { loan } = await json<LoanJson>(await steward.get(`/api/loans/${loanId}`));
  const back = await steward.post(`/api/loans/${loanId}/return`, {
    lines: [{ lineId: loan.lines[0].id, returnedQty: 0, condition: 'damaged', chargeMinor: amountMinor, chargeNote: 'Dropped' }],
  });
  expect(back.status).toBe(200);
  return loanId;
}
const owedOf = async (userId: string) => {
  const rows = await db.selectFrom('charges').select(['amount_minor', 'from_deposit_minor', 'settled_minor']).where('user_id', '=', userId).execute();
  return rows.reduce((s, c) => s + c.amount_minor - c.from_deposit_minor - c.settled_minor, 0);
};
const paymentRow = (id: string) => db.selectFrom('charge_payments').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
const auditOf = (action: string, targetId: string) =>
  db.selectFrom('audit_log').select('detail').where('action', '=', action).where('target_id', '=', targetId).execute();

describe('paying charges by card', () => {
  test('a member pays what they owe on the pay page; duplicate webhooks settle it once, with a receipt', async () => {
    const alicesId = fx.members[0].id;
    const loanId = await owe(0, 2500);
    await owe(0, 1000);
    expect(await owedOf(alicesId)).toBe(3500);

    // Nobody else's charges: another member is refused; a person outside the space is not found.
    expect((await bruno.post(`/api/people/${alicesId}/pay-charges`, {})).status).toBe(403);
    expect((await alice.post(`/api/people/${crypto.randomUUID()}/pay-charges`, {})).status).toBe(404);
    const bad = await alice.post(`/api/people/${alicesId}/pay-charges`, { loanId: 'not-a-loan' });
    expect(bad.status).toBe(400);
    expect((await json<ErrorBody>(bad)).error.fields).toHaveProperty('loanId');

    const first = await alice.post(`/api/people/${alicesId}/pay-charges`, { loanId });
    expect(first.status).toBe(200);
    const { payment } = await json<Paying>(first);
    expect(payment).toMatchObject({ amountMinor: 3500, currency: 'USD' });
    expect(payment.url).toContain('/pay/');
    // A second press, or the steward at the bench, answers the same page.
    const again = await json<Paying>(await alice.post(`/api/people/${alicesId}/pay-charges`, { loanId }));
    const atBench = await json<Paying>(await steward.post(`/api/people/${alicesId}/pay-charges`, {}));
    expect(again.payment.url).toBe(payment.url);
    expect(atBench.payment.paymentId).toBe(payment.paymentId);

    const row = await paymentRow(payment.paymentId);
    expect(row).toMatchObject({ status: 'pending', method: 'card', amount_minor: 3500, currency: 'USD' });
    const session = await stripe.checkout.sessions.retrieve(row.checkout_session_id!);
    expect(session.amount_total).toBe(3500);
    expect(session.success_url).toBe(`${BASE}/loans/${loanId}?charges=paid`);

    expect((await payOnFake(fake, row.checkout_session_id!)).status).toBe(200);
    await waitFor('the payment to be booked', async () => (await paymentRow(payment.paymentId)).status === 'paid');
    await waitFor('every delivery', () => fake.deliveries().every((d) => d.status === 'delivered'));
    expect(await owedOf(alicesId)).toBe(0);
    expect((await paymentRow(payment.paymentId)).payment_intent_id).toMatch(/^pi_/);
    const settled = await auditOf('charge.settled', alicesId);
    expect(settled).toHaveLength(1);
    expect(settled[0].detail).toMatchObject({ method: 'card', amountMinor: 3500, appliedMinor: 3500 });
    const receipt = await waitForMessage({
      to: fx.members[0].email,
      timeoutMs: 15_000,
      match: (m) => m.subject.startsWith('Paid at'),
    });
    expect(receipt.subject).toMatch(/: \$35\.00 towards your charges$/);
    expect(receipt.text).toContain('Nothing more is owed.');
    // Nothing left to pay.
    const none = await alice.post(`/api/people/${alicesId}/pay-charges`, {});
    expect(none.status).toBe(409);
    expect((await json<ErrorBody>(none)).error.message).toBe('Nothing is owed, so there is nothing to pay.');
  });

  test('a session Ohmstead did not open for the payment, or money that is not its amount, settles nothing and is written down', async () => {
    const brunosId = fx.members[1].id;
    await owe(1, 1800);
    const { payment } = await json<Paying>(await bruno.post(`/api/people/${brunosId}/pay-charges`, {}));

    // Someone opens their own session naming our payment in its metadata and pays it.
    const forged = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'usd', unit_amount: 1800, product_data: { name: 'Charges' } }, quantity: 1 }],
      success_url: 'https://example.test/ok',
      metadata: { chargePaymentId: payment.paymentId, userId: brunosId, spaceId: fx.space.id },
    });
    expect((await payOnFake(fake, forged.id)).status).toBe(200);
    await waitFor('every delivery', () => fake.deliveries().every((d) => d.status === 'delivered'));
    expect(await owedOf(brunosId)).toBe(1800);
    expect((await paymentRow(payment.paymentId)).status).toBe('pending');
    const refused = await db
      .selectFrom('audit_log')
      .select('detail')
      .where('space_id', '=', fx.space.id)
      .where('action', '=', 'payment.refused')
      .execute();
    expect(refused.map((r) => (r.detail as { why: string }).why)).toContain(
      `checkout session ${forged.id} is not the one Ohmstead opened for charge payment ${payment.paymentId}`,
    );

    // Our own session, but the amount we hold differs from what the processor took: refused, named.
    await db.updateTable('charge_payments').set({ amount_minor: 1700 }).where('id', '=', payment.paymentId).execute();
    const ours = (await paymentRow(payment.paymentId)).checkout_session_id!;
    expect((await payOnFake(fake, ours)).status).toBe(200);
    await waitFor('every delivery', () => fake.deliveries().every((d) => d.status === 'delivered'));
    expect(await owedOf(brunosId)).toBe(1800);
    expect((await paymentRow(payment.paymentId)).status).toBe('pending');
    const why = (
      await db.selectFrom('audit_log').select('detail').where('space_id', '=', fx.space.id).where('action', '=', 'payment.refused').execute()
    ).map((r) => (r.detail as { why: string }).why);
    expect(why).toContain(
      `charge payment ${payment.paymentId}: the processor's amount (1800) is not the charge payment's (1700), in minor units`,
    );
    // Cash at the bench still settles it (and is kept as a payment for the Books).
    expect((await steward.post(`/api/people/${brunosId}/settle-charges`, { amountMinor: 800 })).status).toBe(200);
    expect(await owedOf(brunosId)).toBe(1000);
  });
});

describe('the treasurer’s month', () => {
  test('the Books show charges raised, paid by card and in cash; the filing CSV has them in their own sections; the card payment is matched', async () => {
    const page = await treasurer.get(`/books?month=${month}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Charges and deposits in');
    // Raised: 2500 + 1000 + 1800; by card 3500; in cash 800 (USD minor units).
    expect(html).toMatch(/data-testid="charges-raised"[^>]*>\$53\.00</);
    expect(html).toMatch(/data-testid="charges-paid-card"[^>]*>\$35\.00</);
    expect(html).toMatch(/data-testid="charges-paid-cash"[^>]*>\$8\.00</);

    const csv = await treasurer.get(`/api/books/export?month=${month}&part=filing`);
    expect(csv.status).toBe(200);
    const rows = Papa.parse<Record<string, string>>(await csv.text(), { header: true, skipEmptyLines: true }).data;
    const paid = rows.filter((r) => r.section === 'charge paid');
    expect(paid.map((r) => [r.method, r.amount_minor, r.buyer]).sort()).toEqual([
      ['card', '3500', fx.members[0].name],
      ['cash', '800', fx.members[1].name],
    ]);
    expect(rows.filter((r) => r.section === 'charge raised').map((r) => Number(r.amount_minor)).sort((a, b) => a - b)).toEqual([1000, 1800, 2500]);

    const recon = await treasurer.get(`/api/books/reconciliation?month=${month}`);
    expect(recon.status).toBe(200);
    const report = await json<{ rows: { chargePayment?: boolean; status: string; oursMinor: number | null; note: string }[] }>(recon);
    const cardRows = report.rows.filter((r) => r.chargePayment);
    expect(cardRows).toEqual([expect.objectContaining({ status: 'matched', oursMinor: 3500, note: 'Paid by card towards charges.' })]);
  });
});

describe('late fees', () => {
  const setClock = (iso: string) =>
    fetch(`${BASE}/api/test/clock`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ offsetMs: new Date(iso).getTime() - Date.now() }),
    });

  test('off by default; once on, a late return is charged once for the opening days late, capped, with a notice', async () => {
    // Lent now; made due in the past afterwards (a member with an overdue loan could not borrow the next).
    const lendMeter = async () => {
      const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
      const lent = await steward.post('/api/loans', { unitIds: [meter.id], borrowerId: fx.members[1].id });
      expect(lent.status).toBe(201);
      return (await json<{ loan: { id: string } }>(lent)).loan.id;
    };
    const dueAt = (id: string, iso: string) => db.updateTable('loans').set({ due_at: new Date(iso) }).where('id', '=', id).execute();
    const lateCharges = (loanId: string) =>
      db.selectFrom('charges').select(['amount_minor', 'item', 'kind']).where('loan_id', '=', loanId).where('kind', '=', 'late').execute();

    // Off (the default): a late return costs nothing.
    const unfeed = await lendMeter();
    await dueAt(unfeed, '2026-11-20T20:00:00Z');
    expect((await steward.post(`/api/loans/${unfeed}/return`, {})).status).toBe(200);
    expect(await lateCharges(unfeed)).toEqual([]);

    // Open Monday to Friday, shut on Tuesday 24 November; 1.50 a day, never more than 4.00.
    const open = { opens: '10:00', closes: '20:00' };
    const rules = await admin.post(
      '/api/settings/borrowing',
      {
        lateFee: { perOpeningDayMinor: 150, capMinor: 400 },
        week: { mon: open, tue: open, wed: open, thu: open, fri: open, sat: null, sun: null },
        closedDates: ['2026-11-24'],
      },
      'PATCH',
    );
    expect(rules.status).toBe(200);
    const badRule = await admin.post('/api/settings/borrowing', { lateFee: { perOpeningDayMinor: 1.5, capMinor: 400 } }, 'PATCH');
    expect(badRule.status).toBe(400);
    expect((await json<ErrorBody>(badRule)).error.fields).toHaveProperty(['lateFee.perOpeningDayMinor']);

    const [twoDays, capped, onTime] = [await lendMeter(), await lendMeter(), await lendMeter()];
    await dueAt(twoDays, '2026-11-20T20:00:00Z'); // a Friday, at closing
    await dueAt(capped, '2026-11-20T20:00:00Z');
    await dueAt(onTime, '2026-11-25T20:00:00Z');
    try {
      // Back Wednesday 25 November: Sat 21 and Sun 22 shut, Mon 23 open, Tue 24 closed date, Wed 25 open → 2 days.
      expect((await setClock('2026-11-25T12:00:00Z')).status).toBe(200);
      expect((await steward.post(`/api/loans/${twoDays}/return`, {})).status).toBe(200);
      expect((await steward.post(`/api/loans/${onTime}/return`, {})).status).toBe(200);
      // Back Wednesday 2 December: Mon 23, Wed 25, Thu 26, Fri 27, Mon 30, Tue 1, Wed 2 → 7 days × 1.50 = 10.50, capped at 4.00.
      expect((await setClock('2026-12-02T12:00:00Z')).status).toBe(200);
      expect((await steward.post(`/api/loans/${capped}/return`, {})).status).toBe(200);
    } finally {
      await fetch(`${BASE}/api/test/clock`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"offsetMs":0}' });
    }
    expect(await lateCharges(twoDays)).toEqual([{ amount_minor: 300, kind: 'late', item: 'Loan: back 2 opening days late' }]);
    expect(await lateCharges(capped)).toEqual([{ amount_minor: 400, kind: 'late', item: 'Loan: back 7 opening days late' }]);
    expect(await lateCharges(onTime)).toEqual([]);
    // Never twice for one loan: a second confirmation is refused and adds nothing.
    expect((await steward.post(`/api/loans/${twoDays}/return`, {})).status).toBe(409);
    expect(await lateCharges(twoDays)).toHaveLength(1);
    const notice = await waitForMessage({
      to: fx.members[1].email,
      timeoutMs: 15_000,
      match: (m) => m.subject.startsWith('Charged at') && m.text.includes('back 2 opening days late'),
    });
    expect(notice.subject).toMatch(/: \$3\.00$/);
    expect(notice.text).toContain('Loan: back 2 opening days late: $3.00');
    await admin.post('/api/settings/borrowing', { lateFee: null, week: null, closedDates: [] }, 'PATCH');
  });
});

describe('a deposit release the processor did not take', () => {
  test('it stays "release pending"; the scheduled retry gives back one refund once the processor answers', async () => {
    const t = await steward.post('/api/kits/templates', {
      name: 'Retry test lamp',
      depositMinor: 4000,
      lines: [{ partId: parts.meter.id, qty: 1 }],
    });
    expect(t.status).toBe(201);
    const templateId = (await json<{ template: { id: string } }>(t)).template.id;
    await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
    const box = await steward.post('/api/kits/boxes', { templateId });
    expect(box.status).toBe(201);
    const boxId = (await json<{ box: { id: string } }>(box)).box.id;
    const borrowed = await alice.post('/api/loans', { kitBoxId: boxId });
    expect(borrowed.status, await borrowed.clone().text()).toBe(201);
    const loanId = (await json<{ loan: { id: string } }>(borrowed)).loan.id;
    const deposit = () => db.selectFrom('deposits').selectAll().where('loan_id', '=', loanId).executeTakeFirstOrThrow();
    expect((await payOnFake(fake, (await deposit()).checkout_session_id!)).status).toBe(200);
    await waitFor('the deposit to be held', async () => (await deposit()).status === 'held');

    const down = await closedPort();
    await pointSpaceAt(fx.space.id, down);
    try {
      const res = await steward.post(`/api/loans/${loanId}/return`, {});
      expect(res.status).toBe(200);
      expect((await json<{ return: { depositReleased: boolean } }>(res)).return.depositReleased).toBe(false);
    } finally {
      await pointSpaceAt(fx.space.id, fake.port);
    }
    expect((await deposit()).status).toBe('releasing');
    const page = await (await steward.get(`/loans/${loanId}`)).text();
    expect(page).toContain('release pending');
    const today = await (await steward.get('/today')).text();
    expect(today).toContain('Deposits waiting to go back');
    expect(today).toContain(`href="/loans/${loanId}"`);

    // The retry while the processor is still down: nothing changes, it is counted as still pending.
    const tooSoon = await runDepositReleaseRetry(db, () => stripeOn(down), { now: new Date(), spaceIds: [fx.space.id], graceMs: 0 });
    expect(tooSoon).toEqual({ checked: 1, released: 0, stillPending: 1 });
    expect((await deposit()).status).toBe('releasing');
    // Within the grace a fresh release is left alone.
    expect(await runDepositReleaseRetry(db, () => stripeOn(fake.port), { now: new Date(), spaceIds: [fx.space.id] })).toEqual({
      checked: 0,
      released: 0,
      stillPending: 0,
    });
    // The processor is back: two runs at once still make one refund (same idempotency key).
    const runs = await Promise.all(
      [0, 1].map(() => runDepositReleaseRetry(db, () => stripeOn(fake.port), { now: new Date(), spaceIds: [fx.space.id], graceMs: 0 })),
    );
    expect(runs.reduce((s, r) => s + r.released, 0)).toBeGreaterThanOrEqual(1);
    await waitFor('the deposit to be released', async () => (await deposit()).status === 'released');
    const d = await deposit();
    const refunds = await stripe.refunds.list({ payment_intent: d.payment_intent_id!, limit: 10 });
    expect(refunds.data.map((r) => r.amount)).toEqual([4000]);
    expect(d.refund_id).toBe(refunds.data[0].id);
    expect(await auditOf('deposit.released', loanId)).toHaveLength(1);
  });
});

describe('deposits on part categories', () => {
  test('a loose borrow with parts of a category that asks for a deposit waits for it; other parts do not', async () => {
    const set = await admin.post('/api/settings/borrowing', { categoryDepositsMinor: { meter: 2500, wire: 300 } }, 'PATCH');
    expect(set.status).toBe(200);
    const bad = await admin.post('/api/settings/borrowing', { categoryDepositsMinor: { meter: 0 } }, 'PATCH');
    expect(bad.status).toBe(400);
    expect((await json<ErrorBody>(bad)).error.fields).toHaveProperty(['categoryDepositsMinor.meter']);
    try {
      const meter = await makeUnit(db, fx.space.id, parts.meter.id, fx.bin.id);
      // The check before borrowing says so.
      const preview = await bruno.post('/api/loans/preview', { unitIds: [meter.id] });
      expect(preview.status).toBe(200);
      expect((await json<{ preview: { deposit: unknown } }>(preview)).preview.deposit).toEqual({ amountMinor: 2500, currency: 'USD' });
      const res = await bruno.post('/api/loans', { unitIds: [meter.id] });
      expect(res.status).toBe(201);
      const { loan } = await json<{ loan: { id: string; status: string; deposit: { url: string; amountMinor: number } | null } }>(res);
      expect(loan.status).toBe('waiting');
      expect(loan.deposit).toMatchObject({ amountMinor: 2500 });
      const d = await db.selectFrom('deposits').selectAll().where('loan_id', '=', loan.id).executeTakeFirstOrThrow();
      expect((await payOnFake(fake, d.checkout_session_id!)).status).toBe(200);
      await waitFor('the loan to start', async () => (await db.selectFrom('loans').select('status').where('id', '=', loan.id).executeTakeFirstOrThrow()).status === 'out');

      // A supply (no deposit on its category) is lent at once.
      const supply = await makeUnit(db, fx.space.id, parts.supply24.id, fx.bin.id);
      const quiet = await json<{ preview: { deposit: unknown } }>(await bruno.post('/api/loans/preview', { unitIds: [supply.id] }));
      expect(quiet.preview.deposit).toBeNull();
      const plain = await bruno.post('/api/loans', { unitIds: [supply.id] });
      expect(plain.status).toBe(201);
      expect((await json<{ loan: { status: string; deposit: unknown } }>(plain)).loan).toMatchObject({ status: 'out', deposit: null });
    } finally {
      await admin.post('/api/settings/borrowing', { categoryDepositsMinor: {} }, 'PATCH');
    }
  });
});
