import JSZip from 'jszip';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedSalesMonth } from '@/db/seed/sales';
import type { PaymentsFake } from '@/fakes/payments/server';
import { listMessages } from '@/lib/mail/mailbox';
import type { Reconciliation } from '@/lib/reconcile/report';
import { monthOf, shiftMonth } from '@/lib/sales/periods';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { session } from './auth-fixtures';
import { counterSpace, ownFake, pointSpaceAt } from './sales-fixtures';

// A space's data out (one zip, one formula-guarded CSV per table it owns) and a person's data away on
// request. The erased member bought by card all last month and borrowed and returned a kit; afterwards
// the month's reconciliation totals and the space's stock history are exactly as before, and their name
// and address are on no page, in no export file and in no e-mail sent after.
const db = testDb();
const month = shiftMonth(monthOf(new Date(), 'UTC'), -1);
let shop: Awaited<ReturnType<typeof counterSpace>>;
let fake: PaymentsFake;
let admin: HttpSession;
let treasurer: HttpSession;
let member: (typeof shop)['people']['member'];
const memberName = 'Wilhelmina Quorndale';

type Movement = { id: string; part_id: string; qty_delta: number; reason: string; created_at: Date };
const stockHistory = async (): Promise<Movement[]> =>
  (await db
    .selectFrom('stock_movements')
    .select(['id', 'part_id', 'qty_delta', 'reason', 'created_at'])
    .where('space_id', '=', shop.space.id)
    .orderBy('id')
    .execute()) as Movement[];

async function totals(): Promise<Reconciliation['totals']> {
  const res = await treasurer.get(`/api/books/reconciliation?month=${month}`);
  expect(res.status).toBe(200);
  return ((await res.json()) as Reconciliation).totals;
}

async function exportFiles(who: HttpSession): Promise<Record<string, string>> {
  const res = await who.get('/api/export');
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toBe('application/zip');
  const zip = await JSZip.loadAsync(await res.arrayBuffer());
  const out: Record<string, string> = {};
  for (const name of Object.keys(zip.files)) if (!zip.files[name]!.dir) out[name] = await zip.files[name]!.async('string');
  return out;
}

beforeAll(async () => {
  shop = await counterSpace(db);
  // The invented month sells more than the counter fixture shelves; top the bins up before it.
  await db.updateTable('stock').set((eb) => ({ qty: eb('qty', '+', 500) })).where('space_id', '=', shop.space.id).execute();
  await db.updateTable('users').set({ name: memberName }).where('id', '=', shop.people.member.id).execute();
  member = { ...shop.people.member, name: memberName };
  const own = await ownFake({ webhooks: false });
  fake = own.fake;
  const person = (u: { id: string; name: string; email: string }) => ({ id: u.id, name: u.name, email: u.email });
  await seedSalesMonth(
    db,
    { url: own.fake.url, stripe: own.stripe },
    { spaceId: shop.space.id, spaceName: shop.space.name, month, steward: person(shop.people.steward), members: [person(member)], seed: 11 },
  );
  await pointSpaceAt(shop.space.id, fake.port);
  // A kit lent and returned, with the steward's note naming the borrower, and an audit detail with the address.
  const lentAt = new Date(Date.now() - 20 * 86_400_000);
  const loan = await db
    .insertInto('loans')
    .values({
      space_id: shop.space.id,
      borrower_id: member.id,
      lent_by_id: shop.people.steward.id,
      status: 'returned',
      out_at: lentAt,
      due_at: new Date(lentAt.getTime() + 7 * 86_400_000),
      returned_at: new Date(lentAt.getTime() + 5 * 86_400_000),
      override_reason: `${memberName} showed a bench-tested build`,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('audit_log')
    .values({ space_id: shop.space.id, actor_id: shop.people.steward.id, action: 'loan.returned', target_type: 'loan', target_id: loan.id, detail: JSON.stringify({ borrower: member.email, note: `called ${memberName}` }) })
    .execute();
  admin = await session(shop.people.admin);
  treasurer = await session(shop.people.treasurer);
});

afterAll(async () => {
  await pointSpaceAt(shop.space.id, null).catch(() => undefined);
  await fake?.close();
  await closeTestDb();
});

describe('export of a space', () => {
  it('is one zip with a CSV for every table the space owns, formula-guarded, no credentials, nothing of another space', async () => {
    const other = await makeSpace(db, { name: 'Another space entirely' });
    await makeUser(db, other.id, ['member'], 'Outsider Person');
    await db.updateTable('parts').set({ notes: '=HYPERLINK("http://x.example","click")' }).where('id', '=', shop.parts.shrink.id).execute();

    const files = await exportFiles(admin);
    const tables = (
      await sql<{ t: string }>`select distinct table_name as t from information_schema.columns where table_schema = 'public' and column_name = 'space_id'`.execute(db)
    ).rows.map((r) => r.t);
    for (const t of tables.filter((t) => !['auth_sessions', 'sign_in_tokens'].includes(t))) expect(Object.keys(files), t).toContain(`${t}.csv`);
    expect(Object.keys(files)).toEqual(expect.arrayContaining(['space.csv', 'people.csv', 'kit_template_lines.csv', 'kit_box_contents.csv']));
    expect(files['sales.csv']!.split('\r\n').length).toBeGreaterThan(5);
    expect(files['parts.csv']).toContain(`'=HYPERLINK`);
    expect(files['people.csv']).toContain(member.email);
    const all = Object.values(files).join('\n');
    expect(all).not.toContain('Another space entirely');
    expect(all).not.toContain('Outsider Person');
    expect(all).not.toMatch(/\$argon2/); // no password hash
    expect(files['people.csv']!.split('\r\n')[0]).toBe('id,name,email,roles,disabled_at,member_since');
  });

  it('is for admins only', async () => {
    expect((await (await session(shop.people.treasurer)).get('/api/export')).status).toBe(403);
    expect((await new HttpSession().get('/api/export')).status).toBe(401);
  });
});

describe('erasing a person on request', () => {
  it('is refused without the right confirmation, for oneself, and for another space’s person', async () => {
    const wrong = await admin.post(`/api/people/${member.id}/erase`, { confirmEmail: 'someone@else.example' });
    expect(wrong.status).toBe(400);
    expect(Object.keys(((await wrong.json()) as { error: { fields: object } }).error.fields)).toEqual(['confirmEmail']);
    expect((await admin.post(`/api/people/${shop.people.admin.id}/erase`, { confirmEmail: shop.people.admin.email })).status).toBe(409);
    const elsewhere = await makeSpace(db);
    const stranger = await makeUser(db, elsewhere.id, ['member']);
    expect((await admin.post(`/api/people/${stranger.id}/erase`, { confirmEmail: stranger.email })).status).toBe(404);
  });

  it('keeps the books and the stock history whole, and leaves their name and address nowhere', { timeout: 120_000 }, async () => {
    const totalsBefore = await totals();
    const historyBefore = await stockHistory();
    const salesBefore = await db.selectFrom('sales').select(['id', 'total_minor', 'status', 'paid_at', 'buyer_id']).where('space_id', '=', shop.space.id).orderBy('id').execute();
    expect(salesBefore.filter((s) => s.buyer_id === member.id).length).toBeGreaterThan(3);
    const mailSince = new Date();

    const res = await admin.post(`/api/people/${member.id}/erase`, { confirmEmail: member.email.toUpperCase() });
    expect(res.status).toBe(200);
    const placeholder = ((await res.json()) as { person: { name: string } }).person.name;
    expect(placeholder).toMatch(/^Erased person /);

    expect(await totals()).toEqual(totalsBefore);
    expect(await stockHistory()).toEqual(historyBefore);
    expect(await db.selectFrom('sales').select(['id', 'total_minor', 'status', 'paid_at', 'buyer_id']).where('space_id', '=', shop.space.id).orderBy('id').execute()).toEqual(salesBefore);

    // Sign-in gone: password refused, no sessions, a link asked for the old address mails nothing.
    const again = new HttpSession();
    await again.signIn(member.email, member.password);
    expect(await again.isSignedIn()).toBe(false);
    expect(await db.selectFrom('auth_sessions').select('id').where('user_id', '=', member.id).execute()).toEqual([]);
    expect((await new HttpSession().post('/api/sign-in-link', { email: member.email })).status).toBe(200);
    await new Promise((r) => setTimeout(r, 1500));

    const seen: string[] = [];
    for (const path of ['/people', `/books?month=${month}`, '/loans', '/counter', '/today']) {
      const page = await admin.get(path);
      seen.push(`${path} ${page.status}`);
      const html = await page.text();
      expect(html, path).not.toContain(memberName);
      expect(html.toLowerCase(), path).not.toContain(member.email.toLowerCase());
    }
    const books = await treasurer.get(`/books?month=${month}`);
    const booksHtml = await books.text();
    expect(booksHtml).not.toContain(memberName);
    expect(booksHtml.toLowerCase()).not.toContain(member.email.toLowerCase());

    const all = Object.values(await exportFiles(admin)).join('\n');
    expect(all).not.toContain(memberName);
    expect(all.toLowerCase()).not.toContain(member.email.toLowerCase());
    expect(all).toContain(placeholder);

    const mail = (await listMessages()).filter((m) => new Date(m.receivedAt ?? 0) >= mailSince);
    for (const m of mail) {
      const text = JSON.stringify(m).toLowerCase();
      expect(text).not.toContain(member.email.toLowerCase());
      expect(text).not.toContain(memberName.toLowerCase());
    }

    const row = await db.selectFrom('audit_log').select(['detail']).where('space_id', '=', shop.space.id).where('action', '=', 'person.erased').executeTakeFirstOrThrow();
    expect(JSON.stringify(row.detail)).not.toContain(member.email);
    expect((await admin.post(`/api/people/${member.id}/erase`, { confirmEmail: member.email })).status).toBe(409); // erased already
  });
});
