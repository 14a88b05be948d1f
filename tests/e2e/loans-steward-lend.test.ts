import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { closeTestDb, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { signedIn } from '../helpers/http';

// In Debian Chromium at phone width, on the demo data of Quillmere Makers: a steward lending loose LEDs
// to a member checks the member's whole build (a 48 V supply and a 36 V-max driver already out with
// them), not the steward's own. Fresh people (not demo ones), so other files' loans never meet this build.

const db = testDb();
let browser: Browser;
let page: Page;
let spaceId: string;
const MEMBER = 'Orrin Vellacott';

async function freeUnit(sku: string) {
  return db
    .selectFrom('units')
    .innerJoin('parts', 'parts.id', 'units.part_id')
    .select(['units.id', 'parts.name'])
    .where('parts.space_id', '=', spaceId)
    .where('parts.sku', '=', sku)
    .where('units.state', '=', 'on_shelf')
    .where('units.kit_box_id', 'is', null)
    .orderBy('units.code')
    .executeTakeFirstOrThrow();
}

beforeAll(async () => {
  spaceId = (
    await db.selectFrom('spaces').select('id').where('slug', '=', 'quillmere').executeTakeFirstOrThrow()
  ).id;
  const member = await makeUser(db, spaceId, ['member'], MEMBER);
  const steward = await makeUser(db, spaceId, ['steward'], 'Tamsin Holloway-Reed');
  const api = await signedIn(member.email, TEST_PASSWORD);
  const supply = await freeUnit('PSU-48V-1.5A');
  const driver = await freeUnit('DRV-B350-36');
  expect((await api.post('/api/loans', { unitIds: [supply.id, driver.id] })).status).toBe(201);
  browser = await launchBrowser();
  page = await newPage(browser, 390);
  await signInPage(page, steward.email, TEST_PASSWORD);
});

afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('a steward lends loose parts to a member', () => {
  test("the check covers the borrower's build, and says whose it is", async () => {
    await page.goto('/loans/new');
    const counted = page.getByRole('region', { name: 'Counted parts' });
    await counted.getByLabel('Part').selectOption({ label: '3 W cool white LED on 20 mm star' });
    await counted.getByLabel('Qty').fill('3');
    await counted.getByRole('button', { name: 'Add' }).click();

    // For the steward alone, three LEDs are not a chain yet.
    await page.getByRole('button', { name: 'Check these parts' }).click();
    const report = page.getByRole('region', { name: 'Compatibility check' });
    await report.getByText('The electrical chain is not complete').waitFor();
    expect(await report.locator('[data-verdict="fail"]').count()).toBe(0);

    // Lending to the member: the same LEDs meet the 48 V supply and 36 V driver they already have.
    await page.getByRole('region', { name: 'Borrower' }).getByLabel('Lend to').selectOption({ label: MEMBER });
    await page.getByRole('button', { name: 'Check these parts' }).click();
    await report.locator('[data-verdict="fail"]').first().waitFor();
    await report.getByText(`Checked as ${MEMBER}’s whole build`).waitFor();
    const held = await report.getByText(`Already out with ${MEMBER}:`).innerText();
    expect(held).toContain('48 V 1.5 A desk supply');
    expect(held).toContain('Constant-current buck driver, 350 mA');
    // The steward may still lend with a written reason; the button says it is for someone else.
    await page.getByRole('button', { name: 'Override and lend' }).waitFor();
    expect(await page.getByRole('form', { name: 'Borrow' }).getByLabel('Lend to').count()).toBe(0);
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
