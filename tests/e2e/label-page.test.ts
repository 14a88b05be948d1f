import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';

// A phone's camera opens a kit box's label (/s/<code>): the box and its verdict are on the page as it
// arrives, at 390 px, with the way to borrow it. And the scan page stays light: the QR decoder is fetched
// only when the camera is asked for, never with the page.

const db = testDb();
let browser: Browser;
let page: Page;
let box: { id: string; code: string; name: string };

beforeAll(async () => {
  const space = await db.selectFrom('spaces').select('id').where('slug', '=', 'quillmere').executeTakeFirstOrThrow();
  box = await db
    .selectFrom('kit_boxes')
    .select(['id', 'code', 'name'])
    .where('space_id', '=', space.id)
    .orderBy('name')
    .executeTakeFirstOrThrow();
  const member = await makeUser(db, space.id, ['member'], 'Hesper Tallowby');
  browser = await launchBrowser();
  page = await newPage(browser, 390);
  await signInPage(page, member.email, TEST_PASSWORD);
});

afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('a label opened on a phone', () => {
  test('/s/<box code> shows the box and its verdict in place, before any script runs', async () => {
    // Scripts off for this look: what the server sent is what the phone shows first.
    const bare = await browser.newContext({ viewport: { width: 390, height: 844 }, javaScriptEnabled: false, storageState: await page.context().storageState() });
    const first = await bare.newPage();
    const res = await first.goto(`${new URL(page.url()).origin}/s/${box.code}`);
    expect(res?.status()).toBe(200);
    expect(new URL(first.url()).pathname).toBe(`/s/${box.code}`);
    await first.getByRole('heading', { level: 1, name: box.name }).waitFor();
    expect(['ok', 'caution', 'fail']).toContain(await first.locator('[data-verdict]').first().getAttribute('data-verdict'));
    await bare.close();

    await page.goto(`/s/${box.code}`);
    await page.getByRole('heading', { name: 'Compatibility check' }).waitFor();
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  test('the scan page fetches the QR decoder only when the camera is asked for', async () => {
    const scripts: string[] = [];
    page.on('request', (r) => {
      if (r.resourceType() === 'script') scripts.push(r.url());
    });
    await page.goto('/scan');
    await page.getByRole('button', { name: 'Use camera' }).waitFor();
    await page.waitForLoadState('networkidle');
    const before = new Set(scripts);
    // Headless Chromium has no camera: the decoder is fetched, then the page says so and offers typing.
    await page.getByRole('button', { name: 'Use camera' }).click();
    await page.getByText(/camera/i).filter({ hasText: /type the code/ }).waitFor();
    const fetched = scripts.filter((u) => !before.has(u));
    expect(fetched.length, 'a chunk fetched on the camera button').toBeGreaterThan(0);
    // And a typed code still works from here (a USB scanner types the same way, ending with Enter).
    await page.getByLabel('Label code').fill(box.code.toLowerCase());
    await page.getByLabel('Label code').press('Enter');
    await page.waitForURL(`**/kits/boxes/${box.id}`);
  });

  test('signing out still works now that its client is fetched on the tap', async () => {
    await page.getByRole('button', { name: 'More' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((u) => u.pathname === '/signin');
    // The session is over on the server too: a label now asks for sign-in.
    await page.goto(`/s/${box.code}`);
    expect(new URL(page.url()).pathname).toBe('/signin');
  });
});
