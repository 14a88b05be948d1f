import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { formatCode } from '@/labels/code';
import { launchBrowser, newPage, signInPage } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

// README.md's "A walk through the demo", walked on a phone-sized window (390 × 844) with the phone's own
// navigation (the bar at the bottom and its "More" sheet). It reads and opens; it changes nothing of the
// demo (the journeys that borrow, pay and send have their own tests), so other files find the demo as seeded.

const db = testDb();
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

/** Opens a section as a person with a phone does: from the bar if it is there, else from "More". */
async function openSection(page: Page, label: string) {
  const bar = page.getByRole('navigation', { name: 'Main sections' });
  const inBar = bar.getByRole('link', { name: label, exact: true });
  if (await inBar.count()) await inBar.click();
  else {
    await bar.getByRole('button', { name: 'More' }).click();
    await page
      .getByRole('dialog', { name: 'All sections' })
      .getByRole('link', { name: label, exact: true })
      .click();
  }
  await page.getByRole('heading', { level: 1 }).first().waitFor();
}

async function person(email: string): Promise<Page> {
  const page = await newPage(browser, 390, 844);
  await signInPage(page, email);
  await page.waitForURL((u) => u.pathname === '/today');
  return page;
}

const fits = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth);

describe('README: a walk through the demo, on a phone', () => {
  test('member: Scan a kit box code → its check → Borrow it; Loans; Counter; loose parts', async () => {
    const page = await person('juniper@quillmere.example');
    const box = await db
      .selectFrom('kit_boxes')
      .innerJoin('spaces', 'spaces.id', 'kit_boxes.space_id')
      .select(['kit_boxes.code', 'kit_boxes.name'])
      .where('spaces.slug', '=', 'quillmere')
      .where('kit_boxes.state', '=', 'on_shelf')
      .where('kit_boxes.name', 'like', 'Shelf light%')
      .executeTakeFirstOrThrow();
    await openSection(page, 'Scan');
    await page.getByLabel('Label code').fill(formatCode(box.code));
    await page.getByRole('button', { name: 'Open', exact: true }).click();
    await page.waitForURL((u) => u.pathname.startsWith('/kits/boxes/'));
    await page.getByRole('heading', { level: 1, name: box.name }).waitFor();
    // The heat caution the README promises, and the borrow button on screen.
    expect(await page.locator('main').innerText()).toMatch(/heat sink|sink/i);
    const borrow = page.getByRole('button', { name: /^Borrow/ });
    await borrow.waitFor();
    const b = (await borrow.boundingBox())!;
    expect(b.x + b.width).toBeLessThanOrEqual(390);
    expect(await fits(page)).toBe(true);

    await openSection(page, 'Loans');
    await page.getByRole('link', { name: 'Borrow loose parts' }).click();
    await page.waitForURL((u) => u.pathname === '/loans/new');
    expect(await fits(page)).toBe(true);

    await openSection(page, 'Counter');
    await page.getByRole('heading', { level: 1, name: 'Counter' }).waitFor();
    expect(await fits(page)).toBe(true);
    await page.context().close();
  });

  test('steward: Today → Loans → Overdue round (send a reminder on screen) → Shelf receive, move, count, labels', async () => {
    const page = await person('tobiah@quillmere.example');
    // Today streams behind its loading shell: wait for its content rather than reading the shell.
    await expect.poll(() => page.locator('main').innerText(), { timeout: 30_000 }).toMatch(/overdue/i);
    await openSection(page, 'Loans');
    await page.getByRole('link', { name: 'Overdue round' }).click();
    await page.waitForURL((u) => u.pathname === '/loans/round');
    const send = page.getByRole('button', { name: 'Send reminder', exact: true }).first();
    await send.waitFor();
    const r = (await send.boundingBox())!;
    expect(r.x + r.width).toBeLessThanOrEqual(390);
    expect(await fits(page)).toBe(true);

    await openSection(page, 'Shelf');
    const shelfTabs = page.getByRole('navigation', { name: 'Shelf' });
    for (const tab of ['Receive', 'Move', 'Counts', 'Labels']) {
      await shelfTabs.getByRole('link', { name: tab, exact: true }).click();
      await page.waitForURL((u) => u.pathname.startsWith('/shelf/'));
      expect(await fits(page), tab).toBe(true);
    }
    await page.context().close();
  });

  test('treasurer: Books for last month', async () => {
    const page = await person('marisol@quillmere.example');
    await openSection(page, 'Books');
    await page.getByRole('heading', { level: 1, name: /Books/ }).waitFor();
    expect(await fits(page)).toBe(true);
    await page.context().close();
  });

  test('admin: People and Settings (the air temperature)', async () => {
    const page = await person('perpetua@quillmere.example');
    await openSection(page, 'People');
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    expect(await fits(page)).toBe(true);
    await openSection(page, 'Settings');
    await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor();
    await page
      .getByText(/air temperature|ambient/i)
      .first()
      .waitFor();
    expect(await fits(page)).toBe(true);
    await page.context().close();
  });

  test('anyone: Bench check, signed in (from More) or not', async () => {
    const page = await newPage(browser, 390, 844);
    await page.goto('/bench-check');
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    expect(await fits(page)).toBe(true);
    await page.context().close();
  });
});
