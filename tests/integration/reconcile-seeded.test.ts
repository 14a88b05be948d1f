import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/seed/people';
import { PLANTED_MISMATCH, seedSalesMonth, type SeededMonth } from '@/db/seed/sales';
import type { PaymentsFake } from '@/fakes/payments/server';
import type { Reconciliation } from '@/lib/reconcile/report';
import { monthOf, shiftMonth } from '@/lib/sales/periods';
import { closeTestDb, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';
import { session } from './auth-fixtures';
import { counterSpace, ownFake, pointSpaceAt } from './sales-fixtures';

// Reconciliation of a seeded month with exactly one planted mismatch (a charge lower than its sale)
// must find exactly that one, and match everything else: first on the demo data that `npm test`
// seeds into Quillmere Makers through the shared payments fake, then on a month this file seeds into
// a space of its own through a fake of its own.

const db = testDb();
afterAll(() => closeTestDb());

const previousMonth = (timeZone: string) => shiftMonth(monthOf(new Date(), timeZone), -1);

async function reconciliation(who: HttpSession, month: string): Promise<Reconciliation> {
  const res = await who.get(`/api/books/reconciliation?month=${month}`);
  expect(res.status).toBe(200);
  return (await res.json()) as Reconciliation;
}

const paidCardSales = async (spaceId: string, r: Reconciliation) =>
  db
    .selectFrom('sales')
    .select('id')
    .where('space_id', '=', spaceId)
    .where('method', '=', 'card')
    .where('status', 'in', ['paid', 'partially_refunded', 'refunded'])
    .where('reverses_sale_id', 'is', null)
    .where('paid_at', '>=', new Date(r.from))
    .where('paid_at', '<', new Date(r.to))
    .execute();

describe('the demo month of Quillmere Makers', () => {
  it('finds exactly the planted mismatch and matches every other charge and refund', async () => {
    const space = await db
      .selectFrom('spaces')
      .select(['id', 'time_zone'])
      .where('slug', '=', 'quillmere')
      .executeTakeFirstOrThrow();
    const month = previousMonth(space.time_zone);
    const treasurer = await signedIn('marisol@quillmere.example', DEMO_PASSWORD);
    const r = await reconciliation(treasurer, month);

    const problems = r.rows.filter((x) => x.status !== 'matched');
    expect(problems).toHaveLength(1);
    const [planted] = problems;
    expect(planted).toMatchObject({ kind: 'charge', status: 'amount_differs' });
    // The planted line: its part charged below the shelf price (see db/seed/sales.ts).
    const line = await db
      .selectFrom('sale_lines')
      .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
      .select(['sale_lines.qty', 'sale_lines.unit_price_minor'])
      .where('sale_lines.sale_id', '=', planted.saleId!)
      .where('parts.sku', '=', PLANTED_MISMATCH.sku)
      .executeTakeFirstOrThrow();
    const discount = Math.min(PLANTED_MISMATCH.discountMinor, Math.floor(line.unit_price_minor / 4));
    expect(planted.differenceMinor).toBe(-line.qty * discount);
    expect(planted.theirsMinor! - planted.oursMinor!).toBe(planted.differenceMinor);

    // Everything else matches: every paid card sale of the month, and the month's refund.
    const sales = await paidCardSales(space.id, r);
    expect(sales.length).toBeGreaterThan(10);
    expect(r.rows.filter((x) => x.kind === 'charge' && x.status === 'matched')).toHaveLength(
      sales.length - 1,
    );
    expect(r.rows.filter((x) => x.kind === 'refund' && x.status === 'matched')).toHaveLength(1);
    expect(r.totals.counts).toEqual({
      matched: sales.length,
      amount_differs: 1,
      ours_only: 0,
      theirs_only: 0,
    });
    // Their gross is our card takings less the planted difference; the month was paid out.
    expect(r.totals.processor.grossMinor).toBe(r.totals.ours.cardMinor + planted.differenceMinor!);
    expect(r.totals.processor.paidOutMinor).toBeGreaterThan(0);
    expect(r.totals.ours.cashMinor).toBeGreaterThan(0);
  });

  it('is refused to anyone but the treasurer', async () => {
    const month = previousMonth('America/Chicago');
    const steward = await signedIn('tobiah@quillmere.example', DEMO_PASSWORD);
    expect((await steward.get(`/api/books/reconciliation?month=${month}`)).status).toBe(403);
    const treasurer = await signedIn('marisol@quillmere.example', DEMO_PASSWORD);
    const bad = await treasurer.get('/api/books/reconciliation?month=November');
    expect(bad.status).toBe(400);
  });
});

describe('a month seeded into a space of its own', () => {
  let shop: Awaited<ReturnType<typeof counterSpace>>;
  let fake: PaymentsFake;
  let seeded: SeededMonth;
  let treasurer: HttpSession;
  const month = previousMonth('UTC');

  beforeAll(async () => {
    shop = await counterSpace(db);
    const own = await ownFake({ webhooks: false });
    fake = own.fake;
    const person = (u: { id: string; name: string; email: string }) => ({
      id: u.id,
      name: u.name,
      email: u.email,
    });
    seeded = await seedSalesMonth(
      db,
      { url: own.fake.url, stripe: own.stripe },
      {
        spaceId: shop.space.id,
        spaceName: shop.space.name,
        month,
        steward: person(shop.people.steward),
        members: [person(shop.people.member), person(shop.people.buyer2)],
        seed: 7,
      },
    );
    await pointSpaceAt(shop.space.id, fake.port);
    treasurer = await session(shop.people.treasurer);
  });

  afterAll(async () => {
    await pointSpaceAt(shop.space.id, null).catch(() => undefined);
    await fake?.close();
  });

  it('finds exactly the planted sale, through the API, the CSV export and the books page', async () => {
    const r = await reconciliation(treasurer, month);
    const problems = r.rows.filter((x) => x.status !== 'matched');
    expect(problems.map((x) => [x.status, x.saleId])).toEqual([['amount_differs', seeded.plantedSaleId]]);
    expect(r.rows.filter((x) => x.kind === 'charge' && x.status === 'matched')).toHaveLength(
      seeded.cardSales.length - 1,
    );
    expect(r.rows.find((x) => x.kind === 'refund')).toMatchObject({
      status: 'matched',
      saleId: seeded.refundedSaleId,
    });
    // The declined and the abandoned sale took no money: they are not in the reconciliation at all.
    expect(
      r.rows.some((x) => x.saleId === seeded.declinedSaleId || x.saleId === seeded.abandonedSaleId),
    ).toBe(false);

    const csv = await treasurer.get(`/api/books/export?month=${month}`);
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/);
    const parsed = Papa.parse<Record<string, string>>(await csv.text(), {
      header: true,
      skipEmptyLines: true,
    });
    expect(parsed.errors).toEqual([]);
    const csvProblems = parsed.data.filter((row) => row.state !== 'matched');
    expect(csvProblems.map((row) => [row.state, row.sale_id])).toEqual([
      ['amounts differ', seeded.plantedSaleId],
    ]);
    expect(parsed.data.filter((row) => row.state === 'matched')).toHaveLength(r.rows.length - 1);

    const page = await treasurer.get(`/books?month=${month}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html.match(/data-status="amount_differs"/g)).toHaveLength(1);
    expect(html).toContain(`data-sale="${seeded.plantedSaleId}"`);
  });
});
