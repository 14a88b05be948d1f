import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { closeTestDb, makeLocation, makePart, makeSpace, makeStock, makeUser, testDb } from '../helpers/db';

// The honour box on phones (390 px), in a space of this file's own with tax added at 8.25 % and cards
// from $1.00: a member's own cash purchase below the card minimum (the counter says why, and offers cash
// only), then a steward's count (short, explained) and banking, then the treasurer's Books month.

const db = testDb();
let browser: Browser;
let member: Page;
let steward: Page;
let treasurer: Page;
let people: Record<'member' | 'steward' | 'treasurer', Awaited<ReturnType<typeof makeUser>>>;

beforeAll(async () => {
  const space = await makeSpace(db, { name: 'Honour box test space' });
  await db
    .updateTable('spaces')
    .set({
      settings: JSON.stringify({
        money: { taxMode: 'exclusive', taxRateBp: 825, taxName: 'Sales tax', minCardMinor: 100, accountCodes: { consumable: '4010' } },
      }),
    })
    .where('id', '=', space.id)
    .execute();
  const bin = await makeLocation(db, space.id);
  const pad = await makePart(db, space.id, { name: 'Thermal pad for star board', priceMinor: 35 });
  await makeStock(db, space.id, pad.id, bin.id, 30);
  people = {
    member: await makeUser(db, space.id, ['member'], 'Ines Marlowe'),
    steward: await makeUser(db, space.id, ['steward'], 'Odile Brack'),
    treasurer: await makeUser(db, space.id, ['treasurer'], 'Piet Vanterpool'),
  };
  browser = await launchBrowser();
  member = await newPage(browser, 390, 844);
  steward = await newPage(browser, 390, 844);
  treasurer = await newPage(browser, 390, 844);
  await signInPage(member, people.member.email, people.member.password);
  await signInPage(steward, people.steward.email, people.steward.password);
  await signInPage(treasurer, people.treasurer.email, people.treasurer.password);
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

describe('the honour box on a phone', () => {
  test('a member below the card minimum is offered cash only, told why, and records their own purchase', async () => {
    await member.goto('/counter');
    await member.getByRole('button', { name: 'Add Thermal pad for star board', exact: true }).click();
    // 35 + tax 35 × 0.0825 = 2.8875 → 3 (once per sale, half away from zero) = 38.
    await member.getByTestId('basket-total').filter({ hasText: '$0.38' }).waitFor();
    expect(await member.getByTestId('basket-subtotal').innerText()).toBe('$0.35');
    expect(await member.getByTestId('basket-tax').innerText()).toBe('$0.03');
    await member.getByTestId('cash-only').getByText('card payments start at $1.00').waitFor();
    expect(await member.getByRole('button', { name: /by card/ }).count()).toBe(0);
    expect(await fitsWidth(member)).toBe(true);
    await member.getByRole('button', { name: 'I put $0.38 cash in the honour box' }).click();
    await member.getByText('Recorded: you put $0.38 in the honour box.').waitFor();

    const sale = await db
      .selectFrom('sales')
      .select(['buyer_id', 'cashier_id', 'channel', 'method', 'total_minor', 'tax_minor'])
      .where('buyer_id', '=', people.member.id)
      .executeTakeFirstOrThrow();
    expect(sale).toEqual({
      buyer_id: people.member.id,
      cashier_id: people.member.id,
      channel: 'honour_box',
      method: 'cash',
      total_minor: 38,
      tax_minor: 3,
    });
  });

  test('a steward counts the box (short, explained) and banks it', async () => {
    await steward.goto('/counter/honour-box');
    expect(await steward.getByTestId('box-expected').innerText()).toBe('$0.38');
    await steward.getByLabel('Cash counted (USD)').fill('0.30');
    await steward.getByTestId('count-difference').getByText('Short by $0.08').waitFor();
    await steward.getByRole('button', { name: 'Record the count' }).click();
    await steward.getByRole('alert').filter({ hasText: 'Check note.' }).waitFor();
    await steward.getByText(/say what you think happened/).waitFor();
    await steward.getByLabel('What happened (needed when the count differs)').fill('Coins stuck in the slot.');
    await steward.getByRole('button', { name: 'Record the count' }).click();
    await steward.getByText('Count of $0.30 recorded.').waitFor();
    await steward.getByTestId('box-counts').getByText('Expected $0.38, counted $0.30 (short by $0.08)').waitFor();

    await steward.getByLabel('Amount banked (USD)').fill('0.30');
    await steward.getByLabel('Deposit reference (optional)').fill('Slip 17');
    await steward.getByRole('button', { name: 'Record the banking' }).click();
    await steward.getByText('$0.30 recorded as banked.').waitFor();
    await steward.getByTestId('box-counts').getByText(/Banked \$0\.30 on .* by Odile Brack \(ref\. Slip 17\)/).waitFor();
    expect(await steward.getByTestId('box-expected').innerText()).toBe('$0.00');
    expect(await fitsWidth(steward)).toBe(true);
    expect(await seriousA11yViolations(steward)).toEqual([]);
  });

  test('the treasurer sees the purchase, the count and the banking in the Books month', async () => {
    await treasurer.goto('/books');
    await treasurer.getByTestId('filing-tax-collected').filter({ hasText: '$0.03' }).waitFor();
    expect(await treasurer.getByTestId('filing-box-difference').innerText()).toBe('-$0.08');
    expect(await treasurer.getByTestId('filing-box-banked').innerText()).toBe('$0.30');
    await treasurer.getByTestId('filing-box').getByText(/counted \$0\.30 \(short by \$0\.08: “Coins stuck in the slot\.”\), by Odile Brack; banked \$0\.30/).waitFor();
    expect(await fitsWidth(treasurer)).toBe(true);
  });
});
