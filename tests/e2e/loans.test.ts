import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { setAppClock } from '../helpers/http';

// The member's and the steward's journeys on the demo data of Quillmere Makers, in Debian Chromium:
// the member types a kit box's code on /scan, reads the check, borrows; the steward, after the app's
// clock has moved past the due date, finds it on the overdue round and sends a reminder; at the bench
// the steward checks it back in with one LED missing. Fresh people (not the demo's) do it, so sign-in
// limits and other test files' loans never get in the way. Member pages at 390 px, checked with axe.

const db = testDb();
const DAY = 86_400_000;
let browser: Browser;
let member: Awaited<ReturnType<typeof makeUser>>;
let steward: Awaited<ReturnType<typeof makeUser>>;
let box: { id: string; code: string; name: string };
let led: { name: string; qty: number };
let loanId: string;
let memberPage: Page;
let stewardPage: Page;

async function pageChecks(page: Page) {
  expect(await seriousA11yViolations(page)).toEqual([]);
  expect(await fitsWidth(page)).toBe(true);
}

beforeAll(async () => {
  const space = await db
    .selectFrom('spaces')
    .select(['id', 'loan_days'])
    .where('slug', '=', 'quillmere')
    .executeTakeFirstOrThrow();
  // A demo box that is on the shelf (the demo has two; other files may hold one of them).
  box = await db
    .selectFrom('kit_boxes')
    .select(['id', 'code', 'name'])
    .where('space_id', '=', space.id)
    .where('state', '=', 'on_shelf')
    .orderBy('name')
    .executeTakeFirstOrThrow();
  const ledLine = await db
    .selectFrom('kit_box_contents')
    .innerJoin('parts', 'parts.id', 'kit_box_contents.part_id')
    .select(['parts.name', 'kit_box_contents.qty'])
    .where('kit_box_id', '=', box.id)
    .where('chain_role', '=', 'led')
    .executeTakeFirstOrThrow();
  led = { name: ledLine.name, qty: ledLine.qty };
  member = await makeUser(db, space.id, ['member'], 'Wren Copperfield');
  steward = await makeUser(db, space.id, ['steward'], 'Oriel Bramblecote');
  browser = await launchBrowser();
  memberPage = await newPage(browser, 390);
  await signInPage(memberPage, member.email, TEST_PASSWORD);
});

afterAll(async () => {
  await setAppClock(0).catch(() => undefined);
  await browser?.close();
  await closeTestDb();
});

describe('member borrows a kit box at the bench', () => {
  test('types the box code on /scan and lands on the box page with its check', async () => {
    await memberPage.goto('/scan');
    await pageChecks(memberPage);
    const input = memberPage.getByRole('textbox', { name: /code/i }).first();
    await input.fill(box.code);
    await input.press('Enter');
    await memberPage.waitForURL(`**/kits/boxes/${box.id}`);
    await memberPage.getByRole('heading', { level: 1, name: box.name }).waitFor();
    await memberPage.getByRole('heading', { name: 'Compatibility check' }).waitFor();
    const verdict = await memberPage
      .locator('#check-heading ~ [data-verdict], #check-heading + [data-verdict]')
      .first()
      .getAttribute('data-verdict');
    expect(['ok', 'caution']).toContain(verdict);
    await memberPage.getByRole('heading', { name: 'Safety' }).waitFor();
    await pageChecks(memberPage);
  });

  test('confirms (ticking the cautions when there are any) and borrows', async () => {
    const borrow = memberPage.getByRole('button', { name: 'Borrow it' });
    const ack = memberPage.getByRole('checkbox', { name: /read the cautions/ });
    if (await ack.count()) {
      await expect(borrow.isDisabled()).resolves.toBe(true);
      await ack.check();
    }
    await borrow.click();
    await memberPage.waitForURL(/\/loans\/[0-9a-f-]{36}$/);
    loanId = memberPage.url().split('/').pop()!;
    await memberPage.getByText('Borrowed by you').waitFor();
    await memberPage
      .getByText(/Due back/)
      .first()
      .waitFor();
    await pageChecks(memberPage);
    const row = await db
      .selectFrom('loans')
      .select(['status', 'kit_box_id', 'check_report'])
      .where('id', '=', loanId)
      .executeTakeFirstOrThrow();
    expect(row).toMatchObject({ status: 'out', kit_box_id: box.id });
    expect(row.check_report).toMatchObject({ kind: 'checked' });
  });
});

describe('steward: the overdue round', () => {
  test('after the clock moves past the due date the loan is overdue and a reminder goes out', async () => {
    const loan = await db
      .selectFrom('loans')
      .select('due_at')
      .where('id', '=', loanId)
      .executeTakeFirstOrThrow();
    await setAppClock(loan.due_at.getTime() - Date.now() + 2 * DAY);
    try {
      stewardPage = await newPage(browser, 1280, 900);
      await signInPage(stewardPage, steward.email, TEST_PASSWORD);
      await stewardPage.goto('/loans/round');
      const row = stewardPage.getByRole('row').filter({ hasText: member.name });
      await row.waitFor();
      await expect(row.getByRole('cell').nth(1).innerText()).resolves.toMatch(/^[1-9]\d*$/);
      expect(await seriousA11yViolations(stewardPage)).toEqual([]);
      await row.getByRole('button', { name: 'Send reminder' }).click();
      await stewardPage.getByRole('status').filter({ hasText: 'Sent 1 reminder' }).waitFor();
      const mail = await waitForMessage({
        to: member.email,
        match: (m) => m.subject.startsWith('Overdue'),
        timeoutMs: 10_000,
      });
      expect(mail.text).toContain(led.name);
      const manual = await db
        .selectFrom('reminders')
        .select(['status', 'sent_by'])
        .where('loan_id', '=', loanId)
        .where('kind', '=', 'manual')
        .execute();
      expect(manual).toEqual([{ status: 'sent', sent_by: steward.id }]);
    } finally {
      await setAppClock(0);
    }
  });
});

describe('return at the bench with one part missing', () => {
  test('the steward checks it in short; the member sees it in their history', async () => {
    await stewardPage.goto(`/loans/${loanId}`);
    const ledItem = stewardPage
      .getByRole('listitem')
      .filter({ hasText: led.name })
      .filter({ has: stewardPage.getByRole('combobox') });
    await ledItem.getByRole('combobox', { name: 'Condition' }).selectOption('missing');
    if (led.qty > 1)
      await ledItem.getByRole('spinbutton', { name: 'Back in good order' }).fill(String(led.qty - 1));
    await stewardPage.getByRole('button', { name: 'Confirm the return' }).click();
    await stewardPage.getByText('returned short', { exact: true }).first().waitFor();

    const row = await db
      .selectFrom('loans')
      .select('status')
      .where('id', '=', loanId)
      .executeTakeFirstOrThrow();
    expect(row.status).toBe('returned_short');
    const lost = await db
      .selectFrom('stock_movements')
      .select('qty_delta')
      .where('ref_id', '=', loanId)
      .where('reason', '=', 'lost')
      .execute();
    expect(lost).toEqual([{ qty_delta: -1 }]);
    const state = await db
      .selectFrom('kit_boxes')
      .select('state')
      .where('id', '=', box.id)
      .executeTakeFirstOrThrow();
    expect(state.state).toBe('in_repair');

    await memberPage.goto('/loans');
    await memberPage.getByRole('heading', { name: 'History' }).waitFor();
    await memberPage.getByRole('link', { name: box.name }).first().waitFor();
    await pageChecks(memberPage);
    await memberPage.goto(`/loans/${loanId}`);
    await memberPage.getByText('returned short', { exact: true }).first().waitFor();
    await pageChecks(memberPage);
  });
});
