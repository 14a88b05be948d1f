import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fitsWidth, launchBrowser, seriousA11yViolations, signInPage } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { BASE } from '../helpers/http';
import { payOnFake, saleRow, setUpCounterShop, waitFor } from '../integration/sales-fixtures';

// On a phone (390 px), in light and dark: the Books page lists a payment Ohmstead refused (a checkout
// session it did not open, naming one of its sales) under "To investigate", and offers the sweep of
// card sales left waiting past their expiry as a button; the counter's status page asks the processor
// again by itself once a sale's payment page has run out.

const db = testDb();
const t = setUpCounterShop();
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function pageAs(email: string, password: string, colorScheme: 'light' | 'dark'): Promise<Page> {
  const context = await browser.newContext({
    viewport: { width: 390, height: 844 },
    baseURL: BASE,
    colorScheme,
  });
  const page = await context.newPage();
  await signInPage(page, email, password);
  return page;
}

async function startSale(): Promise<string> {
  const res = await t.member.post('/api/sales', { lines: [{ partId: t.shop.parts.pads.id, qty: 1 }] });
  expect(res.status).toBe(201);
  return ((await res.json()) as { sale: { id: string } }).sale.id;
}

const runOut = (saleId: string) =>
  db
    .updateTable('sales')
    .set({ expires_at: new Date(Date.now() - 2 * 60_000) })
    .where('id', '=', saleId)
    .execute();

describe('money checks on a phone', () => {
  test('the Books list a refused payment and sweep on a button; the status page checks again', async () => {
    // A member pays one cent on a session of their own that names a real sale.
    const named = await saleRow(db, await startSale());
    const metadata = { saleId: named.id, spaceId: named.space_id };
    const foreign = await t.stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [
        { price_data: { currency: 'usd', unit_amount: 1, product_data: { name: 'Pad' } }, quantity: 1 },
      ],
      success_url: 'http://127.0.0.1:9/done',
      client_reference_id: named.id,
      metadata,
      payment_intent_data: { metadata },
    });
    expect((await payOnFake(t.fake, foreign.id)).status).toBe(200);
    await waitFor('the foreign payment to be refused', async () =>
      (
        await db.selectFrom('payment_events').select('outcome').where('object_id', '=', foreign.id).execute()
      ).some((e) => e.outcome.startsWith('refused')),
    );
    await runOut(named.id);

    for (const scheme of ['light', 'dark'] as const) {
      const books = await pageAs(t.shop.people.treasurer.email, t.shop.people.treasurer.password, scheme);
      await books.goto('/books');
      await books.getByTestId('to-investigate').waitFor();
      expect(await books.getByTestId('to-investigate').innerText()).toContain(foreign.id);
      await books.getByRole('button', { name: 'Check them with the processor now' }).waitFor();
      expect(await fitsWidth(books)).toBe(true);
      expect(await seriousA11yViolations(books)).toEqual([]);
      if (scheme === 'dark') {
        await books.getByRole('button', { name: 'Check them with the processor now' }).click();
        // The page reloads its figures after the sweep: nothing is left waiting, so the offer goes.
        await books.getByText(/still waiting for the processor/).waitFor({ state: 'detached' });
        expect((await saleRow(db, named.id)).status).toBe('expired');
      }
      await books.context().close();
    }

    // The buyer comes back to a sale whose payment page has run out: the page asks again by itself.
    const late = await startSale();
    await runOut(late);
    const status = await pageAs(t.shop.people.member.email, t.shop.people.member.password, 'light');
    await status.goto(`/counter/done?sale=${late}`);
    await status.locator('[data-sale-status="expired"]').waitFor();
    expect(await status.getByRole('status').first().innerText()).toMatch(/Not paid/);
    expect(await fitsWidth(status)).toBe(true);
    expect((await saleRow(db, late)).status).toBe('expired');
    await status.context().close();
  });
});
