import { sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { listMessages } from '@/lib/mail/mailbox';
import { runSaleSweep } from '@/lib/sales/jobs';
import { makeUser, testDb } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { saleRow, setUpCounterShop, stripeOn } from './sales-fixtures';

// No GET changes anything. A sale's status, the Books page and its reports, and the calendar link are
// read any number of times with the rows of every table they could touch counted (and the sales of the
// space fingerprinted) before and after, and no mail sent. The changes they used to make on the way
// now happen on POSTs (a "check again" on the status page, the Books sweep button, a new calendar
// address) and in the scheduled sweep job; those are shown to change what the GETs did not.

const db = testDb();
const t = setUpCounterShop({ webhooks: false });

async function snapshot(spaceId: string, email: string) {
  const counts = await sql<Record<string, string>>`
    select
      (select count(*) from sales where space_id = ${spaceId}) as sales,
      (select count(*) from sales where space_id = ${spaceId} and status = 'pending') as pending,
      (select count(*) from sale_lines where space_id = ${spaceId}) as sale_lines,
      (select count(*) from audit_log where space_id = ${spaceId}) as audit,
      (select count(*) from stock_movements where space_id = ${spaceId}) as movements,
      (select coalesce(sum(qty), 0) from stock where space_id = ${spaceId}) as on_shelf,
      (select count(*) from payment_events where space_id = ${spaceId}) as payment_events,
      (select count(*) from refunds where space_id = ${spaceId}) as refunds,
      (select count(*) from closed_periods where space_id = ${spaceId}) as closed,
      (select count(*) from users where calendar_token is not null) as calendar_tokens,
      (select md5(coalesce(string_agg(s::text, '|' order by s.id), ''))
         from sales s where s.space_id = ${spaceId}) as sales_fingerprint`.execute(db);
  return { ...counts.rows[0], mail: (await listMessages({ to: email })).length };
}

/**
 * A card sale whose checkout session has run out (its expiry set `agoMs` in the past). Two minutes by
 * default: overdue for a status check and the Books sweep, still inside the scheduled job's grace.
 */
async function overdueSale(agoMs = 2 * 60_000): Promise<string> {
  const res = await t.member.post('/api/sales', { lines: [{ partId: t.shop.parts.pads.id, qty: 2 }] });
  expect(res.status).toBe(201);
  const { sale } = (await res.json()) as { sale: { id: string } };
  await db
    .updateTable('sales')
    .set({ expires_at: new Date(Date.now() - agoMs) })
    .where('id', '=', sale.id)
    .execute();
  return sale.id;
}

const sessionStatus = async (saleId: string) =>
  (await t.stripe.checkout.sessions.retrieve((await saleRow(db, saleId)).checkout_session_id!)).status;

describe('GETs on money change nothing', () => {
  it('a sale past its expiry stays as it is through GET /api/sales/[id]; POST …/settle settles it', async () => {
    const saleId = await overdueSale();
    const before = await snapshot(t.shop.space.id, t.shop.people.member.email);
    for (let i = 0; i < 3; i++) {
      const res = await t.member.get(`/api/sales/${saleId}`);
      expect(res.status).toBe(200);
      expect(((await res.json()) as { sale: { status: string } }).sale.status).toBe('pending');
    }
    expect(await snapshot(t.shop.space.id, t.shop.people.member.email)).toEqual(before);
    expect(await sessionStatus(saleId)).toBe('open'); // nothing asked of the processor either

    const settled = await t.member.post(`/api/sales/${saleId}/settle`, {});
    expect(settled.status).toBe(200);
    expect(((await settled.json()) as { sale: { status: string } }).sale.status).toBe('expired');
    expect((await saleRow(db, saleId)).status).toBe('expired');
    expect(await sessionStatus(saleId)).toBe('expired');
    expect(await snapshot(t.shop.space.id, t.shop.people.member.email)).not.toEqual(before);
  });

  it('the Books page and its reports settle nothing; the sweep button (a POST) does', async () => {
    const saleId = await overdueSale();
    const before = await snapshot(t.shop.space.id, t.shop.people.member.email);
    const page = await t.treasurer.get('/books');
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('waiting for the processor'); // the page says what is overdue, and offers the sweep
    for (const path of ['/api/books/reconciliation', '/api/books/export'])
      expect((await t.treasurer.get(path)).status).toBe(200);
    expect(await snapshot(t.shop.space.id, t.shop.people.member.email)).toEqual(before);
    expect(await sessionStatus(saleId)).toBe('open');

    const swept = await t.treasurer.post('/api/books/sweep', {});
    expect(swept.status).toBe(200);
    expect((await saleRow(db, saleId)).status).toBe('expired');
  });

  it('the scheduled sweep job settles sales well past their expiry, and leaves the rest to the processor', async () => {
    const late = await overdueSale(20 * 60_000);
    const recent = await overdueSale();
    const run = await runSaleSweep(db, () => stripeOn(t.fake.port), {
      now: new Date(),
      spaceIds: [t.shop.space.id],
    });
    expect(run).toMatchObject({ spaces: 1, checked: 1, expired: 1, spacesNotReached: 0 });
    expect((await saleRow(db, late)).status).toBe('expired');
    expect((await saleRow(db, recent)).status).toBe('pending');
    expect(await sessionStatus(recent)).toBe('open');
  });

  it('GET /api/calendar/link writes no token; POST makes one, which GET then shows', async () => {
    const person = await makeUser(db, t.shop.space.id, ['member'], 'Calendar reader');
    const s = new HttpSession();
    await s.signIn(person.email, person.password);
    expect(await s.isSignedIn()).toBe(true);
    const before = await snapshot(t.shop.space.id, person.email);
    for (let i = 0; i < 3; i++) {
      const res = await s.get('/api/calendar/link');
      expect(res.status).toBe(200);
      expect(await res.json()).toEqual({ url: null });
    }
    expect(await snapshot(t.shop.space.id, person.email)).toEqual(before);
    const row = await db
      .selectFrom('users')
      .select('calendar_token')
      .where('id', '=', person.id)
      .executeTakeFirstOrThrow();
    expect(row.calendar_token).toBeNull();

    const made = await s.post('/api/calendar/link', {});
    expect(made.status).toBe(200);
    const { url } = (await made.json()) as { url: string };
    expect(url).toMatch(/\/api\/calendar\/[A-Za-z0-9_-]{32}\.ics$/);
    expect(await (await s.get('/api/calendar/link')).json()).toEqual({ url });
  });
});
