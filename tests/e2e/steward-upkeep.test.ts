import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { closeTestDb, makeLocation, makePart, makeSpace, makeStock, makeUnit, makeUser, testDb } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { signedIn } from '../helpers/http';

// The steward at the bench with a phone (390 px), in Debian Chromium: counts a bin found by part of its
// name, leaves the page mid-count and finds the figures kept; abandons a count and sees it leave the
// list at once; checks a box back in short with a note and finds it on Today with what is missing and
// the note; takes a unit out of a box on the box's page. A space of its own, with invented parts.

const db = testDb();
let browser: Browser;
let page: Page;
let steward: Awaited<ReturnType<typeof makeUser>>;
let member: Awaited<ReturnType<typeof makeUser>>;
let space: Awaited<ReturnType<typeof makeSpace>>;
let wire: Awaited<ReturnType<typeof makePart>>;
let led: Awaited<ReturnType<typeof makePart>>;
let driver: Awaited<ReturnType<typeof makePart>>;
let boxId: string;
let boxName: string;

async function pageChecks(p: Page) {
  expect(await seriousA11yViolations(p)).toEqual([]);
  expect(await fitsWidth(p)).toBe(true);
}

beforeAll(async () => {
  space = await makeSpace(db);
  steward = await makeUser(db, space.id, ['steward'], 'Marlo Thistlewood');
  member = await makeUser(db, space.id, ['member'], 'Ada Lindqvist');
  const c1 = await makeLocation(db, space.id, 'Bin C1 · consumables');
  await makeLocation(db, space.id, 'Bin A1 · drivers');
  wire = await makePart(db, space.id, { name: 'Hook-up wire, 22 AWG, black (per metre)', category: 'wire' });
  await makeStock(db, space.id, wire.id, c1.id, 12);

  led = await makePart(db, space.id, {
    name: 'Warm white LED star',
    category: 'led',
    specs: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 },
  });
  await makeStock(db, space.id, led.id, c1.id, 10);
  const supply = await makePart(db, space.id, {
    name: 'Bench wall supply 24 V',
    category: 'supply',
    tracking: 'unit',
    specs: { volts: 24, tolerancePct: 5, maxAmps: 2 },
  });
  driver = await makePart(db, space.id, {
    name: 'Constant-current driver 350 mA',
    category: 'driver',
    tracking: 'unit',
    specs: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
  });
  await makeUnit(db, space.id, supply.id, c1.id);
  await makeUnit(db, space.id, driver.id, c1.id);
  await makeUnit(db, space.id, driver.id, c1.id);

  const api = await signedIn(steward.email, steward.password);
  const t = await api.post('/api/kits/templates', {
    name: 'Reading lamp',
    lines: [
      { partId: supply.id, qty: 1, chainRole: 'supply' },
      { partId: driver.id, qty: 1, chainRole: 'driver' },
      { partId: led.id, qty: 3, chainRole: 'led' },
    ],
  });
  const templateId = ((await t.json()) as { template: { id: string } }).template.id;
  const b = await api.post('/api/kits/boxes', { templateId, name: 'Reading lamp box 1' });
  boxId = ((await b.json()) as { box: { id: string } }).box.id;
  boxName = 'Reading lamp box 1';

  browser = await launchBrowser();
  page = await newPage(browser, 390);
  await signInPage(page, steward.email, steward.password);
});

afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

const openCountOf = async () =>
  db
    .selectFrom('stock_counts')
    .select(['id', 'lines', 'status'])
    .where('space_id', '=', space.id)
    .orderBy('created_at', 'desc')
    .executeTakeFirstOrThrow();

describe('counting a bin', () => {
  test('"C1" finds Bin C1; the column says Recorded; figures are kept as typed and survive leaving the page', async () => {
    await page.goto('/shelf/counts');
    await page.getByLabel(/type any part of its name or code/).fill('C1');
    await page.getByRole('button', { name: 'Start counting' }).click();
    await page.getByRole('heading', { name: 'Counting Bin C1 · consumables' }).waitFor();
    await page.getByRole('columnheader', { name: 'Recorded' }).waitFor();
    expect(await page.getByRole('columnheader', { name: 'Books' }).count()).toBe(0);
    await pageChecks(page);

    await page.getByLabel(`Counted ${wire.name}`).fill('7');
    await page.getByRole('status').filter({ hasText: 'Saved' }).waitFor();
    const saved = await openCountOf();
    expect(saved.lines.find((l) => l.partId === wire.id)?.counted).toBe(7);

    await page.goto('/today');
    await page.goto('/shelf/counts');
    await page.getByRole('button', { name: 'Bin C1 · consumables' }).click();
    await page.getByRole('heading', { name: 'Counting Bin C1 · consumables' }).waitFor();
    await expect(page.getByLabel(`Counted ${wire.name}`).inputValue()).resolves.toBe('7');
    // A reload keeps the count open, figures and all.
    await page.reload();
    await expect(page.getByLabel(`Counted ${wire.name}`).inputValue()).resolves.toBe('7');
  });

  test('an abandoned count leaves the list at once', async () => {
    await page.getByRole('button', { name: 'Abandon' }).click();
    await page.getByText('Count abandoned; no stock changed.').waitFor();
    expect(await page.getByRole('heading', { name: 'Counts in progress' }).count()).toBe(0);
    expect((await openCountOf()).status).toBe('abandoned');
  });

  test('"consumables" and "Bin C1" find the bin too', async () => {
    for (const typed of ['consumables', 'Bin C1']) {
      await page.goto('/shelf/counts');
      await page.getByLabel(/type any part of its name or code/).fill(typed);
      await page.getByRole('button', { name: 'Start counting' }).click();
      await page.getByRole('heading', { name: 'Counting Bin C1 · consumables' }).waitFor();
    }
  });
});

describe('receiving labelled units', () => {
  test('the new codes are listed and exactly their labels print in one step', async () => {
    await page.goto(`/shelf/receive?part=${driver.id}`);
    await page.getByLabel('New units to label').fill('2');
    await page.getByRole('button', { name: 'Receive', exact: true }).click();
    const list = page.getByRole('list', { name: 'New unit codes' });
    await list.waitFor();
    const shown = (await list.getByRole('listitem').allInnerTexts()).map((t) => t.trim());
    expect(shown).toHaveLength(2);
    for (const code of shown) expect(code).toMatch(/^[0-9A-Z]{4}-[0-9A-Z*~$=]{3}$/);
    const newest = await db
      .selectFrom('units')
      .select('code')
      .where('part_id', '=', driver.id)
      .orderBy('created_at', 'desc')
      .limit(2)
      .execute();
    expect(shown.map((c) => c.replace('-', '')).sort()).toEqual(newest.map((u) => u.code).sort());
    const [res] = await Promise.all([
      page.waitForResponse((r) => r.url().endsWith('/api/labels') && r.request().method() === 'POST'),
      page.getByRole('button', { name: 'Print these 2 labels' }).click(),
    ]);
    expect(res.status()).toBe(200);
    expect(res.headers()['x-label-count']).toBe('2');
    const asked = JSON.parse(res.request().postData() ?? '{}') as { selection: { kind: string; codes: string[] } };
    expect(asked.selection.kind).toBe('codes');
    expect(asked.selection.codes.sort()).toEqual(newest.map((u) => u.code).sort());
    await pageChecks(page);
  });
});

describe('a short return and box upkeep', () => {
  let loanId: string;
  test('lending for a member: the button says whom it lends to', async () => {
    await page.goto(`/kits/boxes/${boxId}`);
    const form = page.getByRole('form', { name: 'Borrow' });
    await form.getByRole('button', { name: 'Borrow it' }).waitFor();
    await form.getByLabel('Lend to').selectOption({ label: 'Ada Lindqvist' });
    const ack = form.getByRole('checkbox', { name: /read the cautions/ });
    if (await ack.count()) await ack.check();
    await form.getByRole('button', { name: 'Lend to Ada L.' }).click();
    await page.waitForURL(/\/loans\/[0-9a-f-]{36}$/);
    loanId = page.url().split('/').pop()!;
    const loan = await db.selectFrom('loans').select('borrower_id').where('id', '=', loanId).executeTakeFirstOrThrow();
    expect(loan.borrower_id).toBe(member.id);
  });

  test('checked in short with a note: Today lists the box with what is missing and the note', async () => {
    await page.goto(`/loans/${loanId}`);
    const ledItem = page
      .getByRole('listitem')
      .filter({ hasText: led.name })
      .filter({ has: page.getByRole('combobox') });
    await ledItem.getByRole('combobox', { name: 'Condition' }).selectOption('missing');
    await ledItem.getByRole('spinbutton', { name: 'Back in good order' }).fill('2');
    await page.getByLabel(/^Note/).fill('one star lost on the bus');
    await page.getByRole('button', { name: 'Confirm the return' }).click();
    await page.getByText('returned short', { exact: true }).first().waitFor();

    await page.goto('/today');
    const list = page.getByRole('list', { name: 'Kit boxes out of service' });
    await list.getByRole('link', { name: boxName }).waitFor();
    await list.getByText(`Lacks 1 × ${led.name}`).waitFor();
    await list.getByText(/one star lost on the bus/).waitFor();
    await page.getByText('1 kit box, 0 units in repair').waitFor();
    await pageChecks(page);
  });

  test('a unit is taken out to repair on the box page', async () => {
    await page.goto(`/kits/boxes/${boxId}`);
    await page.getByText('Look after this box').click();
    const row = page.getByRole('listitem').filter({ hasText: driver.name }).filter({ has: page.getByRole('combobox', { name: 'Where it goes' }) });
    await row.getByRole('combobox', { name: 'Where it goes' }).selectOption('repair');
    await page.getByLabel('Why (kept in the history)').fill('hums under load');
    await row.getByRole('button', { name: /^Take out/ }).click();
    await page.getByRole('status').filter({ hasText: 'taken out.' }).waitFor();
    const inRepair = await db
      .selectFrom('units')
      .select(['state', 'notes'])
      .where('part_id', '=', driver.id)
      .where('state', '=', 'in_repair')
      .execute();
    expect(inRepair).toEqual([{ state: 'in_repair', notes: 'hums under load' }]);
    await pageChecks(page);
  });
});
