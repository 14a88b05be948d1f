import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, TEST_PASSWORD, testDb } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage, takeCspViolations } from '../helpers/browser';

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
    await page.getByText('/api/loans/{id}', { exact: true }).first().click();
    await expect.poll(() => page.getByText('anyone signed in').first().isVisible()).toBe(true);
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    expect(takeCspViolations()).toEqual([]);
    await page.context().close();
  });

  test('a CSP violation is seen by the listener (the check can fail)', async () => {
    const page = await newPage(browser, 390);
    await page.goto('/signin');
    // A script the policy does not allow, added the way an injected one would be.
    await page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.__shouldNotRun = 1';
      document.body.append(s);
    });
    await expect.poll(() => takeCspViolations().length, { timeout: 5_000 }).toBeGreaterThan(0);
    expect(await page.evaluate(() => (window as unknown as { __shouldNotRun?: number }).__shouldNotRun)).toBeUndefined();
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
