import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

// Units of measure on a phone (390 px), light and dark: a member of Fernwick (EUR, ISO 4217: two minor
// digits) buys 2.5 m of the demo's twin lead at €1.60 per metre (2.5 × 160 = 400 cents), and a steward
// counts a bin in metres. Fernwick's sales are counted by no other test.

const db = testDb();
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

async function phone(email: string, scheme: 'light' | 'dark'): Promise<Page> {
  const page = await newPage(browser, 390, 844);
  await page.emulateMedia({ colorScheme: scheme });
  await signInPage(page, email);
  return page;
}

const fernwickWire = () =>
  db
    .selectFrom('parts')
    .innerJoin('spaces', 'spaces.id', 'parts.space_id')
    .select(['parts.id', 'parts.name', 'parts.price_minor', 'parts.space_id'])
    .where('parts.sku', '=', 'WIRE-TWIN-22')
    .where('spaces.currency', '=', 'EUR')
    .executeTakeFirstOrThrow();

describe.each(['light', 'dark'] as const)('metres on a phone, %s', (scheme) => {
  test('a member buys 2.5 m of wire at the counter: "€1.60 per metre", €4.00, and 2.5 m leave the shelf', async () => {
    const wire = await fernwickWire();
    expect(wire.price_minor).toBe(160);
    const page = await phone('mirela@fernwick.example', scheme);
    await page.goto('/counter');
    await page.evaluate(() => sessionStorage.clear());
    await page.reload();
    const list = page.getByRole('list', { name: 'Items for sale' });
    await list.waitFor();
    const listText = await list.innerText();
    expect(listText).toContain('€1.60 per metre');
    expect(listText).toContain('per gram');
    expect(listText).not.toContain('per each');

    await page.getByRole('button', { name: `Add ${wire.name}`, exact: true }).click();
    const metres = page.getByLabel(`Metres of ${wire.name}`);
    expect(await metres.getAttribute('inputmode')).toBe('decimal');
    expect(await metres.getAttribute('step')).toBe('0.001');
    await metres.fill('2.5');
    await page.getByTestId('basket-total').filter({ hasText: '€4.00' }).waitFor();
    const basket = await page.getByRole('list', { name: 'Basket lines' }).innerText();
    expect(basket).toContain('€1.60 per metre');
    expect(basket).toContain('m');
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);

    const before = await db.selectFrom('stock').select('qty').where('part_id', '=', wire.id).execute();
    await page.getByRole('button', { name: 'I put €4.00 cash in the honour box' }).click();
    await page.getByText('Recorded: you put €4.00 in the honour box.').waitFor();
    const after = await db.selectFrom('stock').select('qty').where('part_id', '=', wire.id).execute();
    const sum = (rows: { qty: number }[]) => rows.reduce((s, r) => s + r.qty, 0);
    expect(Math.round((sum(before) - sum(after)) * 1000) / 1000).toBe(2.5);
    await page.context().close();
  });
});

test.each(['light', 'dark'] as const)('a steward counts 65.5 m of wire on a bin at 390 px (%s), and the bin then holds 65.5', async (scheme) => {
  const wire = await fernwickWire();
  const bin = await db
    .selectFrom('stock')
    .innerJoin('locations', 'locations.id', 'stock.location_id')
    .select(['locations.id', 'locations.name'])
    .where('stock.part_id', '=', wire.id)
    .executeTakeFirstOrThrow();
  const page = await phone('greta@fernwick.example', scheme);
  await page.goto('/shelf/counts');
  await page.getByLabel('Scan the bin, or type any part of its name or code').fill(bin.name);
  await page.getByRole('button', { name: 'Start counting' }).click();
  const field = page.getByLabel(`Counted ${wire.name}, in metres`);
  await field.waitFor();
  expect(await field.getAttribute('inputmode')).toBe('decimal');
  // The bin's line reads in metres; the figure is typed with a decimal point.
  expect(await page.getByRole('table').innerText()).toMatch(/\d m\b/);
  await field.fill('65.5');
  await page.getByText('Saved', { exact: true }).waitFor();
  expect(await fitsWidth(page)).toBe(true);
  expect(await seriousA11yViolations(page)).toEqual([]);
  await page.getByRole('button', { name: /Post count/ }).click();
  await page.getByText(/^Posted\./).waitFor();
  const row = await db
    .selectFrom('stock')
    .select('qty')
    .where('part_id', '=', wire.id)
    .where('location_id', '=', bin.id)
    .executeTakeFirstOrThrow();
  expect(row.qty).toBe(65.5);
  await page.context().close();
});
