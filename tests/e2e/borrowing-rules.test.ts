import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';

// Borrowing rules in Debian Chromium at phone width (390 px), in light and dark schemes: a steward
// defines an induction and signs a member off on Sign-offs; the member sees their sign-off; the admin
// keeps opening hours and a closed date in Settings. People of a fresh space, so the demo stays as it is.

const db = testDb();
let browser: Browser;
let people: Record<'steward' | 'member' | 'admin', { email: string }>;

beforeAll(async () => {
  browser = await launchBrowser();
  const space = await db
    .insertInto('spaces')
    .values({ slug: `rules-e2e-${Date.now().toString(36)}`, name: 'Rules journey space', currency: 'EUR', time_zone: 'Europe/Berlin' })
    .returning('id')
    .executeTakeFirstOrThrow();
  people = {
    steward: await makeUser(db, space.id, ['steward'], 'Journey steward'),
    member: await makeUser(db, space.id, ['member'], 'Journey member'),
    admin: await makeUser(db, space.id, ['admin'], 'Journey admin'),
  };
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

async function signedInPage(who: keyof typeof people, scheme: 'light' | 'dark' = 'light'): Promise<Page> {
  const page = await newPage(browser);
  await page.emulateMedia({ colorScheme: scheme });
  await signInPage(page, people[who].email, TEST_PASSWORD);
  return page;
}

describe('inductions and sign-offs', () => {
  test('a steward defines an induction and signs a member off, at 390 px', async () => {
    const page = await signedInPage('steward');
    await page.goto('/signoffs');
    await page.getByRole('heading', { level: 1, name: 'Sign-offs' }).waitFor();
    const define = page.getByRole('form', { name: 'Define an induction' });
    await define.getByLabel('Name, in your own words').fill('Bench supply above 24 V');
    await define.getByLabel('What is shown').fill('Switch off, wait, then touch.');
    await define.getByLabel('DC supply').check();
    await define.getByRole('button', { name: 'Define it' }).click();
    await define.getByText('“Bench supply above 24 V” is defined.').waitFor();
    await page.getByText('Needed for: DC supply parts').waitFor();

    const sign = page.getByRole('form', { name: 'Sign someone off' });
    await sign.getByLabel('Member').selectOption({ label: 'Journey member' });
    await sign.getByLabel('Note (optional)').fill('Shown at the bench');
    await sign.getByRole('button', { name: 'Sign off' }).click();
    await sign.getByText('Journey member is signed off for “Bench supply above 24 V”.').waitFor();
    await page.getByText('Journey member: Bench supply above 24 V').waitFor();
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.context().close();
  });

  test('the member sees their own sign-off, in the dark scheme', async () => {
    const page = await signedInPage('member', 'dark');
    await page.goto('/signoffs');
    const mine = page.getByRole('region', { name: 'Your sign-offs' });
    await mine.getByText('Bench supply above 24 V').waitFor();
    expect(await mine.innerText()).toMatch(/Signed off by Journey steward on .+; holds, no end date/);
    // Members define nothing here.
    expect(await page.getByRole('form', { name: 'Define an induction' }).count()).toBe(0);
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.context().close();
  });
});

describe('opening calendar in Settings', () => {
  test('the admin keeps opening hours, shuts Sundays and adds a closed date', async () => {
    const page = await signedInPage('admin');
    await page.goto('/settings');
    const form = page.getByRole('form', { name: 'Borrowing rules' });
    await form.getByLabel('Keep opening hours per weekday.').check();
    await form.getByRole('checkbox', { name: 'Sunday' }).uncheck();
    await form.getByLabel('Closed dates (holidays)').fill('2026-12-24');
    await form.getByRole('button', { name: 'Add the date' }).click();
    await form.getByRole('button', { name: 'Save borrowing rules' }).click();
    await form.getByText('Borrowing rules saved.').waitFor();
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);

    const stored = await db.selectFrom('spaces').select('settings').where('name', '=', 'Rules journey space').executeTakeFirstOrThrow();
    const rules = (stored.settings as { borrowing: { week: Record<string, unknown>; closedDates: string[] } }).borrowing;
    expect(rules.week.sun).toBeNull();
    expect(rules.week.mon).toEqual({ opens: '10:00', closes: '20:00' });
    expect(rules.closedDates).toEqual(['2026-12-24']);
    await page.context().close();
  });
});
