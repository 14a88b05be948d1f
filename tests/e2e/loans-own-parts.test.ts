import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';

// In Debian Chromium at phone width, on the demo data of Quillmere Makers: a member borrowing only LEDs
// describes the supply and the driver they bring, and the chain is checked on those with the LEDs.
// The check (lib/electrical): 3 LEDs of 2.9–3.6 V at 350 mA from a 24 V ± 5 % supply through a 6–36 V buck:
// every rule far from its limit (string at most 10.8 V; 1.26 W per LED on a 3 W rating).

const db = testDb();
let browser: Browser;
let page: Page;

beforeAll(async () => {
  const spaceId = (
    await db.selectFrom('spaces').select('id').where('slug', '=', 'quillmere').executeTakeFirstOrThrow()
  ).id;
  const member = await makeUser(db, spaceId, ['member'], 'Wren Castellane');
  browser = await launchBrowser();
  page = await newPage(browser, 390);
  await signInPage(page, member.email, TEST_PASSWORD);
});

afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('own supply and driver on the loose-borrow screen', () => {
  test('named field errors, then the chain checked with the parts described', async () => {
    await page.goto('/loans/new');
    const counted = page.getByRole('region', { name: 'Counted parts' });
    await counted.getByLabel('Part').selectOption({ label: '3 W cool white LED on 20 mm star' });
    await counted.getByLabel('Qty').fill('3');
    await counted.getByRole('button', { name: 'Add' }).click();

    await page.locator('summary', { hasText: 'My own supply' }).click();
    const voltage = page.getByLabel('Output voltage (V)');
    await voltage.fill('0');
    await page.getByRole('button', { name: 'Use my own supply' }).click();
    await page.locator('[aria-invalid="true"]').first().waitFor();
    expect(await voltage.getAttribute('aria-invalid')).toBe('true');
    expect(await page.getByLabel('Rated current (A)').getAttribute('aria-invalid')).toBe('true');
    await voltage.fill('24');
    await page.getByLabel('Rated current (A)').fill('2');
    await page.getByRole('button', { name: 'Use my own supply' }).click();
    await page.getByText('Checked with your own 24 V supply, rated 2 A.').waitFor();

    await page.locator('summary', { hasText: 'My own driver' }).click();
    await page.getByLabel('Kind').selectOption({ label: 'Buck (switching) driver' });
    await page.getByLabel('Output current (A)').fill('0,35');
    await page.getByLabel('Input, min (V)').fill('6');
    await page.getByLabel('Input, max (V)').fill('36');
    await page.getByRole('button', { name: 'Use my own driver' }).click();
    await page.getByText('Checked with your own buck (switching) driver.').waitFor();

    await page.getByRole('button', { name: 'Check these parts' }).click();
    const report = page.getByRole('region', { name: 'Compatibility check' });
    await report.locator('[data-verdict="ok"]').first().waitFor();
    expect(await report.innerText()).toContain("the borrower's own 24 V supply → the borrower's own buck driver → 3 × 3 W cool white LED on 20 mm star");
    await page.getByRole('button', { name: 'Borrow it' }).waitFor();
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
