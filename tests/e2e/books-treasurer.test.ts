import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { formatMoney } from '@/lib/money';
import { monthLabel, monthOf, monthRange, shiftMonth } from '@/lib/sales/periods';
import { saleRef } from '@/lib/sales/ref';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { payOnFake, saleRow, setUpCounterShop, waitFor } from '../integration/sales-fixtures';

// The treasurer on a phone (390 px), light and dark: the Books open on the latest month with sales and
// say plainly when a month is not one; a mismatched sale's page shows the processor's amount and the
// difference and takes a note; closing a month lists what is still unexplained and asks to confirm
// how many; rows lead with our short references, the processor's own ids a tap away. The buyer's
// payment page gives the short reference and the time on the space's clock with its zone.

const db = testDb();
const t = setUpCounterShop();
const ZONE = 'America/Chicago';
let browser: Browser;
let mismatched: string;
let lastMonthSale: string;
const current = () => monthOf(new Date(), ZONE);
const previous = () => shiftMonth(current(), -1);

async function paidSale(): Promise<string> {
  const res = await t.steward.post('/api/sales', {
    lines: [{ partId: t.shop.parts.pads.id, qty: 2 }],
    buyerId: t.shop.people.buyer2.id,
  });
  expect(res.status).toBe(201);
  const { sale } = (await res.json()) as { sale: { id: string } };
  expect((await payOnFake(t.fake, (await saleRow(db, sale.id)).checkout_session_id!)).status).toBe(200);
  await waitFor('the sale to be paid', async () => (await saleRow(db, sale.id)).status === 'paid');
  return sale.id;
}

beforeAll(async () => {
  browser = await launchBrowser();
  await db.updateTable('spaces').set({ time_zone: ZONE }).where('id', '=', t.shop.space.id).execute();
  // A sale our books hold at 10 cents more than the processor took, and one dated last month.
  mismatched = await paidSale();
  await db
    .updateTable('sales')
    .set((eb) => ({ total_minor: eb('total_minor', '+', 10) }))
    .where('id', '=', mismatched)
    .execute();
  lastMonthSale = await paidSale();
  const at = new Date(monthRange(previous(), ZONE).to.getTime() - 5 * 3600_000);
  await db
    .updateTable('sales')
    .set({ created_at: at, paid_at: at })
    .where('id', '=', lastMonthSale)
    .execute();
  // A sale that matches to the cent: its card on a phone has nothing under "What happened".
  await paidSale();
  // The newest sale is this month's: the Books open on it.
});
afterAll(async () => {
  await browser?.close();
});

async function treasurerPage(colorScheme: 'light' | 'dark'): Promise<Page> {
  const page = await newPage(browser);
  await page.emulateMedia({ colorScheme });
  await signInPage(page, t.shop.people.treasurer.email, t.shop.people.treasurer.password);
  return page;
}

async function phoneSafe(page: Page): Promise<void> {
  expect(await fitsWidth(page)).toBe(true);
  expect(await seriousA11yViolations(page)).toEqual([]);
}

describe('the treasurer on a phone', () => {
  for (const scheme of ['light', 'dark'] as const)
    test(`Books in ${scheme}: a month that is not one, our references, the processor's ids a tap away`, async () => {
      const page = await treasurerPage(scheme);
      await page.goto('/books?month=2099-13');
      await page.getByRole('alert').filter({ hasText: 'is not a month' }).waitFor();
      await phoneSafe(page);

      await page.goto('/books');
      await page.getByRole('heading', { name: `Books · ${monthLabel(current())}` }).waitFor();
      // This month is the latest: nothing leads into the future.
      expect(
        await page.getByRole('link', { name: new RegExp(monthLabel(shiftMonth(current(), 1))) }).count(),
      ).toBe(0);
      const row = page.locator(`tr[data-sale="${mismatched}"]`);
      await row.getByRole('link', { name: saleRef(mismatched) }).waitFor();
      const books = (await (
        await t.treasurer.get(`/api/books/reconciliation?month=${current()}`)
      ).json()) as {
        rows: { saleId: string; processorId: string; status: string; note?: string | null }[];
      };
      // On the phone's cards a matched row without a note leaves off its empty "What happened".
      const explained = books.rows.filter((r) => r.status !== 'matched' || r.note).length;
      expect(explained).toBeGreaterThan(0);
      expect(explained).toBeLessThan(books.rows.length);
      expect(await page.locator('td[data-label="What happened"]:visible').count()).toBe(explained);
      const theirId = books.rows.find((r) => r.saleId === mismatched)!.processorId;
      expect(theirId).toBeTruthy();
      expect(await row.getByText(theirId).isVisible()).toBe(false);
      await row.getByText('Processor’s refs').click();
      await row.getByText(theirId).waitFor();
      await row.getByRole('button', { name: 'Copy the processor’s payment reference' }).waitFor();
      await page.getByText('Taken by card').waitFor();
      await phoneSafe(page);
      await page.context().close();
    });

  test('a mismatched sale shows both amounts and takes a note; closing lists what is unexplained', async () => {
    const page = await treasurerPage('light');
    await page.goto(`/books/sales/${mismatched}`);
    await page.getByRole('heading', { name: `Sale ${saleRef(mismatched)}` }).waitFor();
    const ours = (await saleRow(db, mismatched)).total_minor;
    expect(await page.getByTestId('processor-amount').innerText()).toBe(formatMoney(ours - 10, 'USD'));
    expect(await page.getByTestId('difference').innerText()).toBe(formatMoney(-10, 'USD'));
    await page.getByText('Explain this row').click();
    await page.getByLabel('What you found or did').fill('Ten cents off at the bench for a scuffed pad.');
    await page.getByRole('button', { name: 'Save the note' }).click();
    await page.getByText(`Ten cents off at the bench for a scuffed pad.`).first().waitFor();
    await page.getByText(new RegExp(`Explained:.*${t.shop.people.treasurer.name}`)).waitFor();
    await phoneSafe(page);

    await page.goto(`/books?month=${previous()}`);
    const close = page.getByTestId('close-month');
    await close.getByTestId('unresolved-rows').getByText(saleRef(lastMonthSale)).waitFor();
    const button = close.getByRole('button', { name: `Close ${monthLabel(previous())} with 1 unresolved` });
    expect(await button.isDisabled()).toBe(true);
    await phoneSafe(page);
    await close.getByLabel(/with 1 unresolved row/).check();
    await button.click();
    await page.getByTestId('month-closed').waitFor();
    await page.context().close();
  });

  test('the buyer’s payment page gives the short reference and the time with its zone', async () => {
    const page = await newPage(browser);
    await signInPage(page, t.shop.people.buyer2.email, t.shop.people.buyer2.password);
    await page.goto(`/counter/done?sale=${mismatched}`);
    expect(await page.getByTestId('sale-ref').innerText()).toBe(saleRef(mismatched));
    expect(await page.getByTestId('sale-time').innerText()).toMatch(/\(America\/Chicago, UTC−0[56]:00\)$/);
    expect(await page.content()).not.toContain(`>${mismatched}<`);
    await phoneSafe(page);
    await page.context().close();
  });
});
