import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { navFor, phoneBar, PHONE_BAR_SIZE } from '@/components/shell/nav-items';
import type { Role } from '@/lib/domain';
import { launchBrowser, newPage, signInPage } from '../helpers/browser';

// The navigation on a phone (390 px): every section of every role is reachable (the bar at the bottom and
// its "More" sheet), nothing is cut off, the header stays on one line (with the space switcher too), and the
// sheet works from the keyboard with its state announced (aria-expanded, a modal dialog, Escape, focus).

const PEOPLE: { email: string; roles: Role[] }[] = [
  { email: 'juniper@quillmere.example', roles: ['member'] },
  { email: 'tobiah@quillmere.example', roles: ['steward'] },
  { email: 'marisol@quillmere.example', roles: ['treasurer'] },
  { email: 'perpetua@quillmere.example', roles: ['admin'] },
  { email: 'rosalind@emberquist.example', roles: ['member'] }, // two spaces: the header has the switcher
];

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** Whether the element lies wholly inside the viewport. */
const inView = (page: Page, selector: string) =>
  page.locator(selector).evaluateAll((els) =>
    els.map((el) => {
      const r = el.getBoundingClientRect();
      const ok =
        r.width > 0 &&
        r.left >= 0 &&
        r.right <= window.innerWidth &&
        r.top >= 0 &&
        r.bottom <= window.innerHeight;
      return { text: (el as HTMLElement).innerText.trim(), ok };
    }),
  );

describe.each(PEOPLE)('$email at 390 px', ({ email, roles }) => {
  let page: Page;
  const sections = navFor(roles).map((n) => n.label);

  beforeAll(async () => {
    page = await newPage(browser, 390, 844);
    await signInPage(page, email);
    await page.waitForURL((u) => u.pathname === '/today');
  });
  afterAll(async () => {
    await page?.context().close();
  });

  test('the header keeps to one line and the page does not scroll sideways', async () => {
    const header = page.locator('header').first();
    const logo = header.getByRole('link', { name: 'Ohmstead' });
    const logoBox = (await logo.boundingBox())!;
    // Everything in the header's top row shares the logo's line.
    const row = await header.locator(':scope > div').first().boundingBox();
    expect(row!.height).toBeLessThan(logoBox.height + 24);
    if (email.startsWith('rosalind'))
      await expect.poll(() => page.getByLabel('Space').isVisible()).toBe(true);
    expect(
      await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth),
    ).toBe(true);
  });

  test('the bar at the bottom shows the most-used sections and "More", all inside the screen', async () => {
    const bar = page.getByRole('navigation', { name: 'Main sections' });
    await bar.waitFor();
    const items = await inView(page, 'nav[aria-label="Main sections"] li > *');
    const expected = phoneBar(navFor(roles)).map((n) => n.label);
    expect(expected).toHaveLength(PHONE_BAR_SIZE);
    expect(items.map((i) => i.text)).toEqual([...expected, 'More']);
    expect(
      items.every((i) => i.ok),
      JSON.stringify(items),
    ).toBe(true);
    // The desk's row of sections is not shown on a phone.
    expect(await page.getByRole('navigation', { name: 'Sections', exact: true }).isVisible()).toBe(false);
  });

  test('"More" opens every section, from the keyboard, and Escape gives focus back', async () => {
    const more = page.getByRole('button', { name: 'More' });
    expect(await more.getAttribute('aria-expanded')).toBe('false');
    await more.focus();
    await page.keyboard.press('Enter');
    const sheet = page.getByRole('dialog', { name: 'All sections' });
    await sheet.waitFor();
    expect(await more.getAttribute('aria-expanded')).toBe('true');
    const listed = await inView(page, '#all-sections nav li > a');
    expect(listed.map((l) => l.text)).toEqual(sections);
    expect(
      listed.every((l) => l.ok),
      JSON.stringify(listed),
    ).toBe(true);
    expect(await sheet.getByRole('button', { name: 'Sign out' }).isVisible()).toBe(true);
    // Focus is inside the modal sheet.
    expect(await page.evaluate(() => document.activeElement?.closest('dialog')?.id)).toBe('all-sections');

    await page.keyboard.press('Escape');
    await sheet.waitFor({ state: 'hidden' });
    // The button's state follows the dialog's close event a frame later.
    await expect.poll(() => more.getAttribute('aria-expanded')).toBe('false');
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('More');
  });

  test('a section from the sheet opens, and the sheet closes behind it', async () => {
    const last = navFor(roles).at(-1)!;
    await page.getByRole('button', { name: 'More' }).click();
    await page
      .getByRole('dialog', { name: 'All sections' })
      .getByRole('link', { name: last.label, exact: true })
      .click();
    await page.waitForURL((u) => u.pathname === last.href);
    await page.getByRole('dialog', { name: 'All sections' }).waitFor({ state: 'hidden' });
    expect(await page.getByRole('button', { name: 'More' }).getAttribute('aria-expanded')).toBe('false');
  });
});

test('at 1280 px every section is in the row under the header and the phone bar is hidden', async () => {
  const page = await newPage(browser, 1280, 900);
  await signInPage(page, 'cassius@quillmere.example');
  await page.waitForURL((u) => u.pathname === '/today');
  const row = page.getByRole('navigation', { name: 'Sections', exact: true });
  expect(await row.locator('a').allInnerTexts()).toEqual(navFor(['member']).map((n) => n.label));
  expect(await page.getByRole('navigation', { name: 'Main sections' }).isVisible()).toBe(false);
  await page.context().close();
});
