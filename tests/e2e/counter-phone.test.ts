import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { CatalogItem } from '@/lib/sales/catalog';
import { formatMoney, formatUnitPrice } from '@/lib/money';
import { launchBrowser, newPage, signInPage } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

// The counter as a member meets it on a phone (390 px), in Fernwick (EUR), whose sales no other test counts:
// "+" at the shelf's stock says why it adds nothing; Back from the card page finds the basket as it was, and
// only the paid sale empties it; prices and a build's parts are in plain words, never stored names.

const BUYER = 'tamsin@fernwick.example';
const db = testDb();
let browser: Browser;
let page: Page;
let items: CatalogItem[];
const currency = 'EUR';

beforeAll(async () => {
  browser = await launchBrowser();
  page = await newPage(browser, 390, 844);
  await signInPage(page, BUYER);
  const res = await page.request.get('/api/sales/catalog');
  items = ((await res.json()) as { items: CatalogItem[] }).items;
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

const total = () => page.getByTestId('basket-total').innerText();
/** Waits until the basket shows this total (the stored basket appears once the page has hydrated). */
const totalBecomes = (amount: string) =>
  page.getByTestId('basket-total').filter({ hasText: amount }).waitFor({ timeout: 30_000 });

describe('the counter on a phone', () => {
  test('"+" at the shelf\'s stock says how many there are instead of stopping silently', async () => {
    const few = items
      .filter((i) => i.onShelf > 1 && i.onShelf <= 12)
      .sort((a, b) => a.onShelf - b.onShelf)[0];
    expect(few, 'an item with a few on the shelf').toBeDefined();
    await page.goto('/counter');
    await page.getByRole('button', { name: `Add ${few.name}`, exact: true }).click();
    const more = page.getByRole('button', { name: `One more ${few.name}` });
    for (let n = 1; n < few.onShelf; n++) await more.click();
    const qty = page.getByLabel(`Quantity of ${few.name}`);
    expect(await qty.innerText()).toBe(String(few.onShelf));

    // One past the stock: the button is aria-disabled (still focusable and tappable, so it can say why).
    await more.click({ force: true });
    expect(await qty.innerText()).toBe(String(few.onShelf));
    await page.getByText(`That is all ${few.onShelf} on the shelf.`).waitFor();
    await page
      .getByText(`Only ${few.onShelf} of ${few.name} on the shelf, and all of them are in the basket.`)
      .waitFor();
    expect(await more.getAttribute('aria-disabled')).toBe('true');
    expect(await more.getAttribute('aria-describedby')).toBeTruthy();

    await page.getByRole('button', { name: `Remove ${few.name}` }).click();
    await page.getByText('Empty. Scan a label or add from the list.').waitFor();
  });

  test('going back from the card page keeps the basket; paying empties it', async () => {
    const item = items.find((i) => i.onShelf >= 3)!;
    await page.goto('/counter');
    await page.evaluate(() => sessionStorage.clear()); // whatever an earlier test left in this tab
    await page.reload();
    await page.getByRole('button', { name: `Add ${item.name}`, exact: true }).click();
    await page.getByRole('button', { name: `One more ${item.name}` }).click();
    const price = formatMoney(2 * item.priceMinor, currency);
    expect(await total()).toBe(price);

    await page.getByRole('button', { name: `Pay ${price} by card` }).click();
    await page.waitForURL((u) => u.pathname.startsWith('/pay/'));
    await page.goBack();
    await page.waitForURL((u) => u.pathname === '/counter');
    await totalBecomes(price);
    expect(await page.getByLabel(`Quantity of ${item.name}`).innerText()).toBe('2');

    // A reload of the counter keeps it too (same tab).
    await page.reload();
    await totalBecomes(price);

    await page.getByRole('button', { name: `Pay ${price} by card` }).click();
    await page.waitForURL((u) => u.pathname.startsWith('/pay/'));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: 'Pay', exact: true }).click();
    await page.waitForURL((u) => u.pathname === '/counter/done');
    await page.getByText('Paid. Your receipt is on its way by e-mail.').waitFor({ timeout: 60_000 });

    await page.goto('/counter');
    await page.getByText('Empty. Scan a label or add from the list.').waitFor();
    expect(await total()).toBe(formatMoney(0, currency));
  });

  test('prices read "each" or "per metre", never "per each"', async () => {
    await page.goto('/counter');
    const list = page.getByRole('list', { name: 'Items for sale' });
    await list.waitFor();
    const text = await list.innerText();
    expect(text).not.toContain('per each');
    const each = items.find((i) => i.saleUnit === 'each')!;
    expect(text).toContain(formatUnitPrice(each.priceMinor, currency, 'each'));
    expect(formatUnitPrice(each.priceMinor, currency, 'each')).toMatch(/ each$/);

    // The part's own page says the same.
    const part = await db
      .selectFrom('parts')
      .select('id')
      .where('id', '=', each.id)
      .executeTakeFirstOrThrow();
    await page.goto(`/shelf/parts/${part.id}`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    const body = await page.locator('main').innerText();
    expect(body).toContain(`${formatMoney(each.priceMinor, currency)} each`);
    expect(body).not.toContain('per each');
  });
});

test('a member reads what each part of a build does, not the stored role names', async () => {
  const member = await newPage(browser, 390, 844);
  await signInPage(member, 'cassius@quillmere.example');
  const loan = await db
    .selectFrom('loans')
    .innerJoin('users', 'users.id', 'loans.borrower_id')
    .innerJoin('loan_lines', 'loan_lines.loan_id', 'loans.id')
    .select('loans.id')
    .where('users.email', '=', 'cassius@quillmere.example')
    .where('loan_lines.chain_role', 'is not', null)
    .executeTakeFirstOrThrow();
  await member.goto(`/loans/${loan.id}`);
  const lines = member.locator('#lines-heading + ul');
  await lines.waitFor();
  const text = await lines.innerText();
  expect(text).not.toMatch(/chain:|\bled\b/);
  expect(text).toMatch(/powers the build|drives the LEDs|the LEDs that light/);
  await member.context().close();
});
