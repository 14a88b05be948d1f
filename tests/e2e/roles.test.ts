import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';

// Each demo role of Quillmere Makers (db/seed/people.ts) in Debian Chromium at phone width: signs in,
// lands on its own Today, sees only its own sections. Each person signs in once in this file, since
// sign-in attempts per e-mail are rate limited.

const EVERYONE = ['Today', 'Scan', 'Bench check', 'Shelf', 'Kits', 'Loans', 'Sign-offs'];
const ROLES = [
  {
    role: 'admin',
    email: 'perpetua@quillmere.example',
    nav: [...EVERYONE, 'Restock', 'People', 'Settings'],
    sees: ['The bench', 'People'],
    not: ['Money'],
  },
  {
    role: 'steward',
    email: 'tobiah@quillmere.example',
    nav: [...EVERYONE, 'Counter', 'Restock'],
    sees: ['The bench'],
    not: ['Money', 'People'],
  },
  {
    role: 'treasurer',
    email: 'marisol@quillmere.example',
    nav: [...EVERYONE, 'Books'],
    sees: ['Money'],
    not: ['The bench', 'People'],
  },
  {
    role: 'member',
    email: 'juniper@quillmere.example',
    nav: [...EVERYONE, 'Counter'],
    sees: [],
    not: ['The bench', 'Money', 'People'],
  },
] as const;

let browser: Browser;
const pages: Record<string, Page> = {};

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const navLabels = (page: Page) => page.locator('nav[aria-label="Sections"] a').allInnerTexts();
const h2 = (page: Page, name: string) => page.getByRole('heading', { level: 2, name, exact: true });

describe('sign-in page', () => {
  test('has no serious or critical accessibility problems', async () => {
    const page = await newPage(browser);
    await page.goto('/signin');
    await page.getByRole('heading', { name: 'Sign in to the bench' }).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.context().close();
  });

  test('an anonymous visit to a protected page lands on sign-in, remembering where it was going', async () => {
    const page = await newPage(browser);
    await page.goto('/shelf');
    await page.waitForURL((u) => u.pathname === '/signin');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/shelf');
    await page.getByLabel('E-mail').waitFor();
    await page.context().close();
  });
});

describe('welcome page', () => {
  test('an unknown invitation link explains itself, accessibly', async () => {
    const page = await newPage(browser);
    await page.goto(`/welcome?token=${'Z'.repeat(43)}`);
    await page.getByRole('heading', { level: 1, name: 'This invitation cannot be used' }).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.context().close();
  });
});

describe.each(ROLES)('the $role ($email)', ({ role, email, nav, sees, not }) => {
  test('signs in and lands on their own Today', async () => {
    const page = await newPage(browser);
    pages[role] = page;
    await signInPage(page, email);
    await page.waitForURL((u) => u.pathname === '/today');
    await page.getByRole('heading', { level: 1, name: 'Today at Quillmere Makers' }).waitFor();
    await h2(page, 'My loans').waitFor();
    for (const name of sees) expect(await h2(page, name).count(), name).toBe(1);
    for (const name of not) expect(await h2(page, name).count(), name).toBe(0);
  });

  test('sees only their sections in the navigation', async () => {
    expect(await navLabels(pages[role])).toEqual(nav);
  });

  test('Today fits 390 px and has no serious or critical accessibility problems', async () => {
    const page = pages[role];
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  if (role !== 'admin') {
    test('is turned away from People and Settings', async () => {
      const page = pages[role];
      for (const path of ['/people', '/settings']) {
        await page.goto(path);
        await page.waitForURL((u) => u.pathname === '/forbidden');
      }
    });
  }
});

describe('the admin pages', () => {
  test('People lists the space with roles, and passes the accessibility check', async () => {
    const page = pages.admin;
    await page.goto('/people');
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    const row = page.locator('tr[data-person="juniper@quillmere.example"]');
    await row.waitFor();
    expect(await row.getByRole('checkbox', { name: 'Member' }).isChecked()).toBe(true);
    expect(await row.getByRole('checkbox', { name: 'Admin' }).isChecked()).toBe(false);
    // Fernwick's people are not listed here.
    expect(await page.locator('tr[data-person="aurelio@fernwick.example"]').count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  test('Settings shows field errors from the form and saves nothing that is wrong', async () => {
    const page = await newPage(browser, 1280, 900);
    await page.context().addCookies(await pages.admin.context().cookies());
    await page.goto('/settings');
    await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);

    const loanDays = page.getByLabel('Loan period (days)');
    const before = await loanDays.inputValue();
    await loanDays.fill('0');
    await page.getByLabel('Closing time (HH:MM)').fill('25:00');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('at least 1', { exact: true }).waitFor();
    await page.getByText('a 24-hour time as HH:MM, e.g. 20:00').waitFor();
    expect(await loanDays.getAttribute('aria-invalid')).toBe('true');

    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor();
    await expect.poll(() => page.getByLabel('Loan period (days)').inputValue()).toBe(before);
    await page.context().close();
  });
});

describe('switching space', () => {
  test('rosalind, a member in both spaces, switches to Fernwick and back from the header', async () => {
    const page = await newPage(browser);
    await signInPage(page, 'rosalind@emberquist.example');
    await page.waitForURL((u) => u.pathname === '/today');
    const start = (await page.getByRole('heading', { level: 1 }).innerText()).replace('Today at ', '');
    const target = start === 'Quillmere Makers' ? 'Fernwick Institute Electronics Lab' : 'Quillmere Makers';

    await page.getByLabel('Space').selectOption({ label: target });
    await page.getByRole('heading', { level: 1, name: `Today at ${target}` }).waitFor();
    expect(await navLabels(page)).toEqual([...EVERYONE, 'Counter']);

    // Put her back where she was, so other tests find the demo as seeded.
    await page.getByLabel('Space').selectOption({ label: start });
    await page.getByRole('heading', { level: 1, name: `Today at ${start}` }).waitFor();
    await page.context().close();
  });
});
