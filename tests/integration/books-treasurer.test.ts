import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { waitForMessage } from '@/lib/mail/mailbox';
import { formatMoney } from '@/lib/money';
import type { BooksRow, Reconciliation } from '@/lib/reconcile/report';
import { monthLabel, monthOf, monthRange, shiftMonth } from '@/lib/sales/periods';
import { saleRef } from '@/lib/sales/ref';
import { testDb } from '../helpers/db';
import { errorOf, session, staffedSpace } from './auth-fixtures';
import { payOnFake, saleRow, setUpCounterShop, waitFor } from './sales-fixtures';

// The treasurer's findings of issue 12, through real HTTP against the real database: the CSV in the
// space's own time (with offset) and without totals among its rows; which month the Books open on and
// what a month that is not one answers; notes that resolve a row, and closing a month that still has
// unresolved rows; our short sale reference and the local time with its zone on the e-mailed receipt.

const db = testDb();
const t = setUpCounterShop();
const ZONE = 'America/Chicago';
const current = () => monthOf(new Date(), ZONE);
const previous = () => shiftMonth(current(), -1);
const REF = /^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/;

let lateInMonth: string; // paid 21:00 on the previous month's last day, Chicago time (already next month in UTC)
let beforeMonth: string; // paid 23:30 on the last day of the month before that (next month in UTC)

beforeAll(async () => {
  await db.updateTable('spaces').set({ time_zone: ZONE }).where('id', '=', t.shop.space.id).execute();
});

/** A card sale to the second member, paid through the processor. */
async function paidSale(qty = 1): Promise<string> {
  const res = await t.steward.post('/api/sales', {
    lines: [{ partId: t.shop.parts.shrink.id, qty }],
    buyerId: t.shop.people.buyer2.id,
  });
  expect(res.status).toBe(201);
  const { sale } = (await res.json()) as { sale: { id: string } };
  expect((await payOnFake(t.fake, (await saleRow(db, sale.id)).checkout_session_id!)).status).toBe(200);
  await waitFor('the sale to be paid', async () => (await saleRow(db, sale.id)).status === 'paid');
  return sale.id;
}

/** Moves a paid sale's times (the processor's charge stays where it is: the row is ours only). */
const dateSale = (id: string, at: Date) =>
  db.updateTable('sales').set({ created_at: at, paid_at: at }).where('id', '=', id).execute();

async function reconciliation(month?: string): Promise<Reconciliation> {
  const res = await t.treasurer.get(`/api/books/reconciliation${month ? `?month=${month}` : ''}`);
  expect(res.status).toBe(200);
  return (await res.json()) as Reconciliation;
}

const parse = (text: string) =>
  Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });

describe('the CSV export', () => {
  it('writes times on the space’s clock with the offset, and picks rows by its local month', async () => {
    const month = previous();
    const { to } = monthRange(month, ZONE);
    lateInMonth = await paidSale(2);
    await dateSale(lateInMonth, new Date(to.getTime() - 3 * 3600_000));
    beforeMonth = await paidSale(1);
    await dateSale(beforeMonth, new Date(monthRange(month, ZONE).from.getTime() - 30 * 60_000));

    const res = await t.treasurer.get(`/api/books/export?month=${month}`);
    expect(res.status).toBe(200);
    const { data, meta, errors } = parse(await res.text());
    expect(errors).toEqual([]);
    const row = data.find((r) => r.sale_id === lateInMonth);
    // 21:00 Chicago standard time on the month's last day (UTC−06:00), as written in ISO 8601.
    expect(row?.when).toMatch(new RegExp(`^${month}-\\d{2}T21:00:00-06:00$`));
    expect(row?.sale).toBe(saleRef(lateInMonth));
    expect(row?.sale).toMatch(REF);
    expect(data.some((r) => r.sale_id === beforeMonth)).toBe(false);
    for (const r of data) expect(r.when.startsWith(month)).toBe(true);
    // Our own column names, none of the processor's words.
    expect(meta.fields).toContain('our_amount');
    expect(meta.fields).not.toContain('balance_transaction');
    expect(meta.fields).not.toContain('ours');
  });

  it('keeps totals out of the rows: a column sums to the total of its own file', async () => {
    const month = previous();
    const rows = parse(await (await t.treasurer.get(`/api/books/export?month=${month}`)).text()).data;
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => ['sale payment', 'refund', 'refused payment'].includes(r.entry))).toBe(true);
    const summed = rows
      .filter((r) => r.entry === 'sale payment')
      .reduce((s, r) => s + Math.round(Number(r.our_amount || 0) * 100), 0);

    const totalsRes = await t.treasurer.get(`/api/books/export?month=${month}&part=totals`);
    expect(totalsRes.status).toBe(200);
    expect(totalsRes.headers.get('content-disposition')).toContain('totals');
    const totals = parse(await totalsRes.text()).data;
    const card = totals.find((r) => r.figure === 'card sales');
    expect(card).toBeDefined();
    expect(Math.round(Number(card!.amount) * 100)).toBe(summed);
    expect(summed).toBe((await saleRow(db, lateInMonth)).total_minor);
  });
});

describe('which month the Books show', () => {
  it('opens on the latest month with activity, not an empty current month', async () => {
    const r = await reconciliation();
    expect(r.month).toBe(previous());
    const page = await t.treasurer.get('/books');
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain(`Books · ${monthLabel(previous())}`);
  });

  it('answers a month that is not one with a 400 naming month, and the page says so', async () => {
    for (const path of ['/api/books/reconciliation?month=2099-13', '/api/books/export?month=2099-13']) {
      const res = await t.treasurer.get(path);
      expect(res.status).toBe(400);
      expect((await errorOf(res)).fields?.month?.[0]).toMatch(/not a month/i);
    }
    const page = await t.treasurer.get('/books?month=2099-13');
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('is not a month');
    expect(html).not.toContain(`Books · ${monthLabel(current())}`);
  });

  it('never offers the future: a month not yet begun is refused, and no link leads past this month', async () => {
    const next = shiftMonth(current(), 1);
    const res = await t.treasurer.get(`/api/books/reconciliation?month=${next}`);
    expect(res.status).toBe(400);
    expect((await errorOf(res)).fields?.month?.[0]).toMatch(/not begun/);
    const page = await (await t.treasurer.get(`/books?month=${current()}`)).text();
    expect(page).not.toContain(`href="/books?month=${next}"`);
    expect(page).toContain(`href="/books?month=${previous()}"`);
    const future = await (await t.treasurer.get(`/books?month=${next}`)).text();
    expect(future).toContain('has not begun yet');
  });
});

describe('explaining rows that do not match', () => {
  let mismatched: string;
  let matched: string;

  beforeAll(async () => {
    // Our books say 25 cents more than the processor took for this sale.
    mismatched = await paidSale(1);
    await db
      .updateTable('sales')
      .set((eb) => ({ total_minor: eb('total_minor', '+', 25) }))
      .where('id', '=', mismatched)
      .execute();
    matched = await paidSale(1);
  });

  const rowOf = (r: Reconciliation, saleId: string) => r.rows.find((x) => x.saleId === saleId) as BooksRow;

  it('shows the processor’s amount and the difference on the sale’s page', async () => {
    const r = await reconciliation(current());
    const row = rowOf(r, mismatched);
    expect(row).toMatchObject({
      status: 'amount_differs',
      differenceMinor: -25,
      saleRef: saleRef(mismatched),
    });
    const html = await (await t.treasurer.get(`/books/sales/${mismatched}`)).text();
    expect(html).toContain(`data-testid="processor-amount">${formatMoney(row.theirsMinor!, 'USD')}`);
    expect(html).toContain(`data-testid="difference">${formatMoney(-25, 'USD')}`);
    expect(html).toContain(`Sale ${saleRef(mismatched)}`);
  });

  it('takes a note on the row in one transaction with its audit line, and names who wrote it', async () => {
    const month = current();
    const key = rowOf(await reconciliation(month), mismatched).key;

    const blank = await t.treasurer.post('/api/books/resolutions', { month, rowKey: key, note: '   ' });
    expect(blank.status).toBe(400);
    expect((await errorOf(blank)).fields?.note).toBeDefined();
    const onMatched = await t.treasurer.post('/api/books/resolutions', {
      month,
      rowKey: rowOf(await reconciliation(month), matched).key,
      note: 'Fine.',
    });
    expect(onMatched.status).toBe(400);
    expect((await errorOf(onMatched)).fields?.rowKey).toBeDefined();
    expect(
      (await t.treasurer.post('/api/books/resolutions', { month, rowKey: 'txn_nothing_here', note: 'x' }))
        .status,
    ).toBe(404);
    // Another space's treasurer cannot reach this row: it is not in their books.
    const other = await staffedSpace(db, 'Another books space');
    const stranger = await session(other.people.treasurer);
    expect(
      (await stranger.post('/api/books/resolutions', { month, rowKey: key, note: 'Mine now.' })).status,
    ).toBe(404);
    expect((await t.steward.post('/api/books/resolutions', { month, rowKey: key, note: 'x' })).status).toBe(
      403,
    );

    const note = 'Charged 25 cents less at the bench by agreement (damaged sleeve pack).';
    const res = await t.treasurer.post('/api/books/resolutions', { month, rowKey: key, note });
    expect(res.status).toBe(201);
    const { resolution } = (await res.json()) as { resolution: { writtenBy: string; writtenAt: string } };
    expect(resolution.writtenBy).toBe(t.shop.people.treasurer.name);

    const stored = await db
      .selectFrom('recon_resolutions')
      .selectAll()
      .where('space_id', '=', t.shop.space.id)
      .where('row_key', '=', key)
      .executeTakeFirstOrThrow();
    expect(stored).toMatchObject({ note, sale_id: mismatched, written_by: t.shop.people.treasurer.id });
    const audited = await db
      .selectFrom('audit_log')
      .select(['actor_id', 'target_id'])
      .where('space_id', '=', t.shop.space.id)
      .where('action', '=', 'books.row_resolved')
      .execute();
    expect(audited).toEqual([{ actor_id: t.shop.people.treasurer.id, target_id: mismatched }]);

    const after = rowOf(await reconciliation(month), mismatched);
    expect(after.resolution).toMatchObject({ note, writtenBy: t.shop.people.treasurer.name });
    const html = await (await t.treasurer.get(`/books/sales/${mismatched}`)).text();
    expect(html).toContain(note);
  });

  it('closes a month with unresolved rows only when the treasurer confirms how many', async () => {
    const month = previous();
    const r = await reconciliation(month);
    const open = r.rows.filter((x) => x.status !== 'matched' && !x.resolution);
    expect(open.map((x) => x.saleId)).toEqual([lateInMonth]);
    expect(r.unresolved).toBe(1);

    const refused = await t.treasurer.post('/api/books/periods', { month });
    expect(refused.status).toBe(409);
    const why = await errorOf(refused);
    expect(why.message).toContain(saleRef(lateInMonth));
    expect(why.fields?.confirmUnresolved).toBeDefined();
    const miscounted = await t.treasurer.post('/api/books/periods', { month, confirmUnresolved: 2 });
    expect(miscounted.status).toBe(409);
    expect(
      await db.selectFrom('closed_periods').select('month').where('space_id', '=', t.shop.space.id).execute(),
    ).toEqual([]);

    const closed = await t.treasurer.post('/api/books/periods', { month, confirmUnresolved: 1 });
    expect(closed.status).toBe(201);
    const period = await db
      .selectFrom('closed_periods')
      .select('summary')
      .where('space_id', '=', t.shop.space.id)
      .executeTakeFirstOrThrow();
    expect((period.summary as { unresolved: string[] }).unresolved).toEqual([open[0].key]);
  });

  it('closes without a confirmation once every row is explained', async () => {
    const month = shiftMonth(previous(), -1);
    const [row] = (await reconciliation(month)).rows;
    expect(row).toMatchObject({ saleId: beforeMonth, status: 'ours_only' });
    expect(
      (
        await t.treasurer.post('/api/books/resolutions', {
          month,
          rowKey: row.key,
          note: 'Paid, processor lost it.',
        })
      ).status,
    ).toBe(201);
    expect((await t.treasurer.post('/api/books/periods', { month })).status).toBe(201);
  });
});

describe('the e-mailed receipt', () => {
  it('gives our short reference, not the sale’s UUID, and the local time with its zone', async () => {
    const id = await paidSale(1);
    const receipt = await waitForMessage({
      to: t.shop.people.buyer2.email,
      timeoutMs: 15_000,
      match: (m) => m.text.includes(saleRef(id)),
    });
    expect(receipt.subject).toContain(saleRef(id));
    // The sale's id may only appear inside the link back to the sale, never as its reference.
    expect(receipt.text.replace(/https?:\/\/\S+/g, '')).not.toContain(id);
    expect((receipt.html ?? '').replace(/href="[^"]*"/g, '')).not.toContain(id);
    expect(receipt.text).toMatch(/\(America\/Chicago, UTC−0[56]:00\)/);
  });
});
