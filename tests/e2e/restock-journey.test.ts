import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { waitForMessage } from '@/lib/mail/mailbox';
import { closeTestDb, makeLocation, makePart, makeSpace, makeStock, makeUser, testDb } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';

// The restocking loop in Debian Chromium at phone width (390 px): the steward sees what to order on
// Today, starts the supplier's order list, sends it (the mail with the CSV arrives at the dev mailbox),
// receives part of it and prints exactly the new units' labels; the treasurer then sees the spend
// beside the sales in the Books. A space of its own, with an invented supplier and parts.

const db = testDb();
let browser: Browser;
let page: Page;
let steward: Awaited<ReturnType<typeof makeUser>>;
let treasurer: Awaited<ReturnType<typeof makeUser>>;
const supplierMail = `journey-${randomUUID().slice(0, 8)}@wrenfold.example`;

async function pageChecks(p: Page) {
  expect(await seriousA11yViolations(p)).toEqual([]);
  expect(await fitsWidth(p)).toBe(true);
}

beforeAll(async () => {
  const space = await makeSpace(db, { timeZone: 'UTC' });
  steward = await makeUser(db, space.id, ['steward'], 'Odile Marchbank');
  treasurer = await makeUser(db, space.id, ['treasurer'], 'Pim Osterley');
  const bin = await makeLocation(db, space.id, 'Bin D2 · supplies');
  const supply = await makePart(db, space.id, { name: 'Desk supply 12 V', category: 'supply', tracking: 'unit', reorderPoint: 2 });
  const ties = await makePart(db, space.id, { name: 'Cable ties, bag', reorderPoint: 10 });
  await makeStock(db, space.id, ties.id, bin.id, 2);
  const supplier = await db
    .insertInto('suppliers')
    .values({ space_id: space.id, name: 'Wrenfold Trading', email: supplierMail, lead_days: 6 })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('supplier_offers')
    .values([
      { space_id: space.id, supplier_id: supplier.id, part_id: supply.id, item_ref: 'WF-12', pack_size: 1, pack_price_minor: 2500, preferred: true },
      { space_id: space.id, supplier_id: supplier.id, part_id: ties.id, item_ref: 'WF-T', pack_size: 5, pack_price_minor: 400, preferred: true },
    ])
    .execute();
  browser = await launchBrowser();
  page = await newPage(browser, 390);
  await signInPage(page, steward.email, steward.password);
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('steward restocks at phone width', () => {
  test('Today → to order → order list → sent with its CSV → part received → exactly the new labels printed', async () => {
    await page.goto('/today');
    const toOrder = page.getByRole('link', { name: /2\s+parts to order/ });
    await toOrder.waitFor();
    await toOrder.click();
    await page.waitForURL(/\/orders$/);
    // Desk supply: 0 on hand, reorder at 2 → 2 × 25.00; ties: 2 on hand, reorder at 10 → short 8 → 2 packs of 5 × 4.00.
    await page.getByText('To order: 2 parts, $58.00').waitFor();
    await pageChecks(page);

    await page.getByRole('button', { name: 'Start an order list for Wrenfold Trading' }).click();
    await page.waitForURL(/\/orders\/[0-9a-f-]{36}$/);
    await pageChecks(page);
    await page.getByRole('button', { name: 'Send the order list' }).click();
    await page.getByText('Sent to the supplier, with the list attached as a CSV file.').waitFor();

    const mail = await waitForMessage({ to: supplierMail, timeoutMs: 10_000 });
    const csv = mail.attachments?.find((a) => a.filename.endsWith('.csv'));
    expect(csv?.text).toContain('WF-12');
    const orderUrl = page.url();
    await page.goto(`/dev/mailbox/${mail.id}`);
    await page.getByRole('heading', { name: 'Attached files' }).waitFor();
    expect(await page.getByText(csv!.filename).count()).toBeGreaterThan(0);

    await page.goto(orderUrl);
    await page.getByLabel('Units (each gets a label)').fill('1');
    await page.getByRole('button', { name: 'Receive' }).click();
    await page.getByRole('heading', { name: 'New labels' }).waitFor();
    const codes = await page.getByRole('list', { name: 'New unit codes' }).locator('li').allTextContents();
    expect(codes).toHaveLength(1);
    await pageChecks(page);

    const [request] = await Promise.all([
      page.waitForRequest((r) => r.url().endsWith('/api/labels') && r.method() === 'POST'),
      page.getByRole('button', { name: 'Print these 1 label' }).click(),
    ]);
    const sent = JSON.parse(request.postData() ?? '{}') as { selection: { kind: string; codes: string[] } };
    expect(sent.selection.kind).toBe('codes');
    expect(sent.selection.codes).toHaveLength(1);
    const unit = await db.selectFrom('units').select('code').where('code', '=', sent.selection.codes[0]).executeTakeFirst();
    expect(unit).toBeTruthy();
    expect(codes[0].replace(/[^0-9A-Z]/gi, '').toUpperCase()).toBe(sent.selection.codes[0].replace(/[^0-9A-Z]/gi, '').toUpperCase());
  });

  test('the treasurer sees the spend beside the month’s sales', async () => {
    const t = await newPage(browser, 390);
    await signInPage(t, treasurer.email, treasurer.password);
    await t.goto(`/books?month=${new Date().toISOString().slice(0, 7)}`);
    await t.getByRole('heading', { name: /Restocking beside sales/ }).waitFor();
    expect(await t.getByTestId('spend-rows').textContent()).toContain('spent $25.00');
    await pageChecks(t);
    await t.context().close();
  });
});
