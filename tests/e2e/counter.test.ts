import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { formatCode } from '@/labels/code';
import { waitForMessage } from '@/lib/mail/mailbox';
import { formatMoney } from '@/lib/money';
import { monthOf } from '@/lib/sales/periods';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

// A member of Quillmere Makers buys three consumables at the counter on a phone, pays on the payments
// fake's hosted page with its success card, is told the sale is paid and gets the receipt in the dev
// mailbox; the treasurer then finds the sale matched in the month's reconciliation.

const BUYER = 'ines@quillmere.example';
const TREASURER = 'marisol@quillmere.example';
const SKUS = ['CON-TPAD', 'CON-TERM2', 'CON-LEVER2'];
const db = testDb();
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('the counter', () => {
  test('a member buys three consumables by card, gets a receipt, and the treasurer sees the sale matched', async () => {
    const space = await db
      .selectFrom('spaces')
      .select(['id', 'time_zone', 'currency'])
      .where('slug', '=', 'quillmere')
      .executeTakeFirstOrThrow();
    const parts = await db
      .selectFrom('parts')
      .select(['id', 'name', 'sku', 'code', 'price_minor'])
      .where('space_id', '=', space.id)
      .where('sku', 'in', SKUS)
      .execute();
    expect(parts).toHaveLength(3);
    const byCode = parts.find((p) => p.sku === 'CON-LEVER2')!;

    const page = await newPage(browser); // 390 px wide
    await signInPage(page, BUYER);
    await page.goto('/counter');
    await page.getByRole('heading', { level: 1, name: 'Counter' }).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
    expect(await fitsWidth(page)).toBe(true);

    // Two from the list, one by typing its label code the way it is printed (with the hyphen).
    for (const p of parts.filter((x) => x !== byCode))
      await page.getByRole('button', { name: `Add ${p.name}`, exact: true }).click();
    await page.getByLabel('Label code').fill(formatCode(byCode.code!));
    await page.getByLabel('Label code').press('Enter');
    await page.getByText(`Added ${byCode.name}.`).waitFor();
    const total = parts.reduce((s, p) => s + p.price_minor!, 0);
    expect(await page.getByTestId('basket-total').innerText()).toBe(
      formatMoney(total, space.currency.trim()),
    );
    expect(await fitsWidth(page)).toBe(true);

    await page
      .getByRole('button', { name: `Pay ${formatMoney(total, space.currency.trim())} by card` })
      .click();
    await page.waitForURL((u) => u.pathname.startsWith('/pay/'));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: 'Pay', exact: true }).click();
    await page.waitForURL((u) => u.pathname === '/counter/done');
    const saleId = new URL(page.url()).searchParams.get('sale')!;
    await page.getByText('Paid. Your receipt is on its way by e-mail.').waitFor({ timeout: 60_000 });
    expect(await seriousA11yViolations(page)).toEqual([]);
    expect(await fitsWidth(page)).toBe(true);

    const receipt = await waitForMessage({
      to: BUYER,
      timeoutMs: 30_000,
      match: (m) => m.text.includes(saleId),
    });
    for (const p of parts) expect(receipt.text).toContain(p.name);
    expect(receipt.text).toContain(`Total ${formatMoney(total, space.currency.trim())}`);
    const moves = await db
      .selectFrom('stock_movements')
      .select(['part_id', 'qty_delta'])
      .where('ref_type', '=', 'sale')
      .where('ref_id', '=', saleId)
      .execute();
    expect(moves.map((m) => m.qty_delta)).toEqual([-1, -1, -1]);
    await page.context().close();

    const books = await newPage(browser, 1280, 900);
    await signInPage(books, TREASURER);
    await books.goto(`/books?month=${monthOf(new Date(), space.time_zone)}`);
    const row = books.locator(`tr[data-sale="${saleId}"]`);
    await row.waitFor();
    expect(await row.getAttribute('data-status')).toBe('matched');
    await row.getByText('matched', { exact: true }).waitFor();
    expect(await seriousA11yViolations(books)).toEqual([]);
    await books.context().close();
  });
});
