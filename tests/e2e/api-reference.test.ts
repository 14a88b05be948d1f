import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, TEST_PASSWORD, testDb } from '../helpers/db';
import {
  fitsWidth,
  launchBrowser,
  newPage,
  seriousA11yViolations,
  signInPage,
  takeCspViolations,
} from '../helpers/browser';

// The API reference for admins (app/(app)/settings/api), reached from Settings, in Chromium at phone
// width and in the dark scheme, under the app's Content-Security-Policy: no violation, no sideways scroll.
let browser: Browser;
let adminEmail: string;

beforeAll(async () => {
  browser = await launchBrowser();
  const space = await makeSpace(testDb(), { name: 'Reference space' });
  adminEmail = (await makeUser(testDb(), space.id, ['admin'], 'Reference admin')).email;
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('API reference page', () => {
  test('an admin opens it from Settings and reads every route, with no CSP violation', async () => {
    const page = await newPage(browser, 390);
    await page.emulateMedia({ colorScheme: 'dark' });
    await signInPage(page, adminEmail, TEST_PASSWORD);
    await page.goto('/settings');
    await page.getByRole('link', { name: 'API reference' }).click();
    await page.waitForURL('**/settings/api');
    await page.getByRole('heading', { name: 'API reference', level: 1 }).waitFor();
    const operations = page.locator('details');
    expect(await operations.count()).toBeGreaterThan(60);
    const loan = page.locator('details', { has: page.getByText('/api/loans/{id}', { exact: true }) }).first();
    await loan.locator('summary').click();
    await expect.poll(() => loan.getByText('anyone signed in').isVisible()).toBe(true);
    await expect.poll(() => loan.getByText('404', { exact: true }).isVisible()).toBe(true);
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    expect(takeCspViolations()).toEqual([]);
    await page.context().close();
  });

  test('a CSP violation is seen by the listener (the check can fail)', async () => {
    const page = await newPage(browser, 390);
    // The real sign-in page with its real policy, plus an inline script without the nonce, as an
    // injected one would arrive: the browser must refuse it and the listener must see that.
    await page.route('**/signin', async (route) => {
      const res = await route.fetch();
      const html = (await res.text()).replace('</body>', '<script>window.__shouldNotRun = 1</script></body>');
      await route.fulfill({ response: res, body: html });
    });
    await page.goto('/signin');
    await expect.poll(() => takeCspViolations().join('\n'), { timeout: 5_000 }).toMatch(/script-src/);
    expect(
      await page.evaluate(() => (window as unknown as { __shouldNotRun?: number }).__shouldNotRun),
    ).toBeUndefined();
    await page.context().close();
  });

  test('a member is sent to the forbidden page', async () => {
    const space = await makeSpace(testDb());
    const member = await makeUser(testDb(), space.id, ['member']);
    const page = await newPage(browser, 390);
    await signInPage(page, member.email, TEST_PASSWORD);
    await page.goto('/settings/api');
    await page.waitForURL('**/forbidden');
    await page.context().close();
  });
});
