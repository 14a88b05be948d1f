import { sql } from 'kysely';
import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { makeStripe } from '@/lib/payments/stripe';
import { roundQty } from '@/lib/inventory/measure';
import { basketTotal, priceBasket, type PricedLine } from '@/lib/sales/basket';
import { writeCashSale } from '@/lib/sales/cash';
import { checkoutIdempotencyKey, checkoutParams } from '@/lib/sales/checkout';
import { markSaleEnded, markSalePaid } from '@/lib/sales/paid';
import { monthOf, monthRange, shiftMonth, type Month } from '@/lib/sales/periods';
import { saleRef } from '@/lib/sales/ref';
import { applyRefund, refundMetadata, refundState, lockSale } from '@/lib/sales/refunds';
import { seededRandom } from '@/lib/seeded-random';
import { moneyRules, taxRuleOf } from '@/lib/money-rules/settings';
import { refundAmountForLines, taxSale, taxWords } from '@/lib/sales/tax';

// A month of invented consumable sales that exist both in our database and at the payments fake:
// every card sale is a real checkout session paid on the fake (so its ledger holds the charge, the
// fee, the refund and the payout), dated inside the month by moving the fake's clock while it is made.
// Exactly one mismatch is planted for the treasurer to find: one sale whose processor charge is
// lower than the sale we hold (as if a price had been typed wrong at the till).

const SUCCESS_CARD = '4242 4242 4242 4242';
const DECLINE_CARD = '4000 0000 0000 0002';
const DEMO_APP_URL = 'http://127.0.0.1:3000';

/** The planted mismatch: this part's line is charged at a lower unit price than the sale says. */
export const PLANTED_MISMATCH = { sku: 'HS-BAR-200', discountMinor: 45 };

type Person = { id: string; name: string; email: string };
type Fake = { url: string; stripe: Stripe };

async function control(
  fake: Fake,
  route: string,
  body?: unknown,
): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await fetch(`${fake.url}/_fake/${route}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
    signal: AbortSignal.timeout(5_000),
  });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}

const setFakeClock = (fake: Fake, at: Date) =>
  control(fake, 'clock', { now: Math.floor(at.getTime() / 1000) });

export type SeededMonth = {
  month: Month;
  cardSales: string[];
  cashSales: string[];
  plantedSaleId: string;
  refundedSaleId: string;
  declinedSaleId: string;
  abandonedSaleId: string;
};

/**
 * Seeds one month of sales into a space through the fake. Used by the demo (Quillmere, last month) and
 * by tests that want a seeded month of their own. The fake's clock is put back as it was afterwards.
 */
export async function seedSalesMonth(
  db: Db,
  fake: Fake,
  opts: {
    spaceId: string;
    spaceName: string;
    month: Month;
    appBaseUrl?: string;
    seed?: number;
    steward: Person;
    members: Person[];
  },
): Promise<SeededMonth> {
  const space = await db
    .selectFrom('spaces')
    .select(['currency', 'time_zone'])
    .where('id', '=', opts.spaceId)
    .executeTakeFirstOrThrow();
  const currency = space.currency.trim();
  const { from, to } = monthRange(opts.month, space.time_zone);
  // The space's tax rule as it stands, on every sale as the counter would put it (lib/sales/tax.ts).
  const rules = await moneyRules(db, opts.spaceId);
  const tax = taxRuleOf(rules);
  // Deterministic, so the demo month is the same on every machine.
  const random = seededRandom(opts.seed ?? 20261);
  const pick = <T>(xs: T[]) => xs[Math.floor(random() * xs.length)];
  // Stock summed per part (a part may sit in several bins), in a fixed order: the demo month must not
  // depend on the order the database happens to return rows in.
  const shelf = await db
    .selectFrom('parts')
    .innerJoin('stock', 'stock.part_id', 'parts.id')
    .select(['parts.id', 'parts.sku', 'parts.price_minor', 'parts.sale_unit', sql<number>`sum(stock.qty)`.as('qty')])
    .where('parts.space_id', '=', opts.spaceId)
    .where('parts.sellable', '=', true)
    .where('parts.tracking', '=', 'counted')
    .where('parts.price_minor', '>', 1)
    .groupBy(['parts.id', 'parts.sku', 'parts.price_minor', 'parts.sale_unit'])
    .having(sql`sum(stock.qty)`, '>=', 1)
    .orderBy('parts.sku')
    .orderBy('parts.id')
    .execute();
  // Baskets draw on well-stocked parts only, and what a basket takes is counted off, so a month of sales
  // never asks for more than the shelf holds (whatever else the demo seeded before it).
  const catalog = shelf.filter((p) => p.qty >= 12);
  if (catalog.length < 3)
    throw new Error('seedSalesMonth: the space needs at least three sellable parts with stock');
  const left = new Map(shelf.map((p) => [p.id, p.qty]));
  const unitOf = new Map(shelf.map((p) => [p.id, p.sale_unit]));
  // What one person takes of a part, from one draw: one or two items, a length of wire off the reel
  // (1 to 2.5 m in half metres), or some solder off the spool (10 to 25 g).
  const amount = (id: string, r: number) => {
    const unit = unitOf.get(id);
    if (unit === 'metre') return 1 + Math.floor(r * 4) / 2;
    if (unit === 'gram') return [10, 15, 20, 25][Math.floor(r * 4)];
    return 1 + Math.floor(r * 2);
  };
  const planted = shelf.find((p) => p.sku === PLANTED_MISMATCH.sku) ?? catalog[0];
  const discount = Math.min(PLANTED_MISMATCH.discountMinor, Math.floor(planted.price_minor! / 4));

  // Shop hours, 17:00–20:59 local, on about two days in three.
  const days = Math.round((to.getTime() - from.getTime()) / 86_400_000);
  const times: Date[] = [];
  for (let d = 0; d < days; d++) {
    const visits = random() < 0.35 ? 0 : random() < 0.7 ? 1 : 2;
    for (let v = 0; v < visits; v++)
      times.push(new Date(from.getTime() + d * 86_400_000 + (17 + random() * 3.9) * 3_600_000));
  }
  times.sort((a, b) => a.getTime() - b.getTime());

  const basket = async (must?: string): Promise<PricedLine[]> => {
    const wanted = new Map<string, number>();
    if (must && (left.get(must) ?? 0) >= amount(must, 0)) wanted.set(must, amount(must, 0));
    const n = 1 + Math.floor(random() * 3);
    // A bounded number of draws: a part with too little left is passed over, never asked for.
    for (let tries = 0; wanted.size < n && tries < 20; tries++) {
      const id = pick(catalog).id;
      const qty = amount(id, random());
      if (!wanted.has(id) && (left.get(id) ?? 0) >= qty + 2) wanted.set(id, qty);
    }
    if (!wanted.size) {
      const fullest = catalog.reduce((a, b) => ((left.get(b.id) ?? 0) > (left.get(a.id) ?? 0) ? b : a));
      wanted.set(fullest.id, amount(fullest.id, 0));
    }
    for (const [id, qty] of wanted) left.set(id, roundQty((left.get(id) ?? 0) - qty));
    return priceBasket(
      db,
      opts.spaceId,
      [...wanted].map(([partId, qty]) => ({ partId, qty })),
    );
  };

  const original = Number((await control(fake, 'clock')).json.offset_seconds ?? 0);
  const out: SeededMonth = {
    month: opts.month,
    cardSales: [],
    cashSales: [],
    plantedSaleId: '',
    refundedSaleId: '',
    declinedSaleId: '',
    abandonedSaleId: '',
  };
  try {
    const plantedAt = times[Math.floor(times.length * 0.4)];
    const refundAt = times[Math.floor(times.length * 0.2)];
    const declinedAt = times[Math.floor(times.length * 0.55)];
    const abandonedAt = times[Math.floor(times.length * 0.75)];
    const cashAt = new Set([0.1, 0.35, 0.6, 0.85].map((f) => times[Math.floor(times.length * f)]));

    for (const at of times) {
      const buyer = pick(opts.members);
      if (cashAt.has(at)) {
        const lines = await basket();
        const sale = await db.transaction().execute((trx) =>
          writeCashSale(trx, {
            spaceId: opts.spaceId,
            currency,
            buyerId: buyer.id,
            cashierId: opts.steward.id,
            lines,
            at,
            tax,
          }),
        );
        out.cashSales.push(sale.id);
        continue;
      }
      const isPlanted = at === plantedAt;
      const lines = await basket(isPlanted ? planted.id : undefined);
      await setFakeClock(fake, at);
      const taxed = taxSale(basketTotal(lines), tax);
      const sale = await db
        .insertInto('sales')
        .values({
          space_id: opts.spaceId,
          buyer_id: buyer.id,
          cashier_id: buyer.id,
          method: 'card',
          status: 'pending',
          currency,
          total_minor: taxed.totalMinor,
          tax_mode: tax.mode,
          tax_rate_bp: tax.rateBp,
          tax_minor: taxed.taxMinor,
          created_at: at,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await db
        .insertInto('sale_lines')
        .values(
          lines.map((l) => ({
            sale_id: sale.id,
            space_id: opts.spaceId,
            part_id: l.partId,
            qty: l.qty,
            unit_price_minor: l.unitPriceMinor,
          })),
        )
        .execute();
      const charged = lines.map((l) => ({
        name: l.name,
        qty: l.qty,
        saleUnit: l.saleUnit,
        unitPriceMinor: isPlanted && l.partId === planted.id ? l.unitPriceMinor - discount : l.unitPriceMinor,
      }));
      // Tax added to shelf prices is its own line on the pay page, as at the counter (lib/sales/card.ts).
      if (tax.mode === 'exclusive' && taxed.taxMinor > 0)
        charged.push({ name: taxWords(rules.taxName, tax), qty: 1, saleUnit: 'each', unitPriceMinor: taxed.taxMinor });
      const session = await fake.stripe.checkout.sessions.create(
        checkoutParams({
          saleId: sale.id,
          spaceId: opts.spaceId,
          currency,
          lines: charged,
          appBaseUrl: opts.appBaseUrl ?? DEMO_APP_URL,
          buyerEmail: buyer.email,
          description: `${opts.spaceName} counter sale ${saleRef(sale.id)}`,
          nowSeconds: Math.floor(at.getTime() / 1000),
        }),
        { idempotencyKey: checkoutIdempotencyKey(sale.id) },
      );
      await db
        .updateTable('sales')
        .set({ checkout_session_id: session.id, expires_at: new Date(session.expires_at * 1000) })
        .where('id', '=', sale.id)
        .execute();

      if (at === abandonedAt || at === declinedAt) {
        // Walked away from the pay page, or the card was declined and they gave up: nothing taken.
        const declined = at === declinedAt;
        if (declined) await control(fake, `sessions/${session.id}/pay`, { card: DECLINE_CARD });
        await fake.stripe.checkout.sessions.expire(session.id);
        await db.transaction().execute((trx) =>
          markSaleEnded(trx, sale.id, declined ? 'failed' : 'expired', {
            source: 'seed',
            reason: declined ? 'card declined' : 'left the pay page',
          }),
        );
        if (declined) out.declinedSaleId = sale.id;
        else out.abandonedSaleId = sale.id;
        continue;
      }
      const paid = await control(fake, `sessions/${session.id}/pay`, { card: SUCCESS_CARD });
      if (paid.status !== 200)
        throw new Error(`seed: the payments fake refused to pay ${session.id}: ${JSON.stringify(paid.json)}`);
      const pi = (paid.json.payment_intent as { id: string }).id;
      await db.transaction().execute((trx) =>
        markSalePaid(trx, {
          saleId: sale.id,
          paymentIntentId: pi,
          amountMinor: session.amount_total,
          currency: session.currency,
          paidAt: at,
          source: 'seed',
          backdate: true,
        }),
      );
      out.cardSales.push(sale.id);
      if (isPlanted) out.plantedSaleId = sale.id;

      if (at === refundAt) {
        // Two days later the buyer brings one line back unopened: refunded and put back on the shelf.
        const refundTime = new Date(at.getTime() + 2 * 86_400_000);
        await setFakeClock(fake, refundTime);
        const row = await db
          .selectFrom('sales')
          .selectAll()
          .where('id', '=', sale.id)
          .executeTakeFirstOrThrow();
        const line = (await refundState(db, row)).lines[0];
        const refundLines = [{ saleLineId: line.id, qty: 1 }];
        const refund = await fake.stripe.refunds.create(
          {
            payment_intent: pi,
            amount: refundAmountForLines(line.unit_price_minor, tax),
            reason: 'requested_by_customer',
            metadata: refundMetadata({
              saleId: sale.id,
              spaceId: opts.spaceId,
              by: opts.steward.id,
              restock: true,
              lines: refundLines,
            }),
          },
          { idempotencyKey: `ohm-refund-${sale.id}-1` },
        );
        await db.transaction().execute(async (trx) =>
          applyRefund(trx, await lockSale(trx, opts.spaceId, sale.id), {
            processorRefundId: refund.id,
            amountMinor: refund.amount,
            lines: refundLines,
            restock: true,
            actorId: null,
            source: 'seed',
            at: refundTime,
          }),
        );
        out.refundedSaleId = sale.id;
      }
    }
    // The month's takings paid out to the bank on its last evening.
    await setFakeClock(fake, new Date(to.getTime() - 2 * 3_600_000));
    await control(fake, 'payouts', { currency: currency.toLowerCase() });
    if (!out.plantedSaleId || !out.refundedSaleId)
      throw new Error('seedSalesMonth: the month is too short to plant its mismatch and refund');
  } finally {
    const now = Number((await control(fake, 'clock')).json.offset_seconds ?? 0);
    await control(fake, 'clock', { advance: original - now });
  }
  return out;
}

/**
 * The demo's month of sales in Quillmere Makers (the month before `clock`). Skipped, with a note to
 * print, when the space already has sales or when the payments fake is not answering.
 */
export async function seedSales(
  db: Db,
  clock: Date = new Date(),
  env: NodeJS.ProcessEnv = process.env,
): Promise<{ seeded: boolean; note: string }> {
  const space = await db
    .selectFrom('spaces')
    .select(['id', 'name', 'time_zone'])
    .where('slug', '=', 'quillmere')
    .executeTakeFirst();
  if (!space) return { seeded: false, note: 'demo sales skipped: there is no Quillmere Makers space' };
  const existing = await db
    .selectFrom('sales')
    .select('id')
    .where('space_id', '=', space.id)
    .limit(1)
    .executeTakeFirst();
  if (existing) return { seeded: false, note: 'demo sales already present: left as they are' };

  const protocol = env.PAYMENTS_API_PROTOCOL || 'http';
  const host = env.PAYMENTS_API_HOST || '127.0.0.1';
  const port = Number(env.PAYMENTS_API_PORT || 12111);
  const url = `${protocol}://${host}:${port}`;
  try {
    const health = await fetch(`${url}/_fake/health`, { signal: AbortSignal.timeout(2_000) });
    if (!health.ok) throw new Error(`answered ${health.status}`);
  } catch (err) {
    return {
      seeded: false,
      note: `demo sales skipped: the payments fake at ${url} is not answering (${err instanceof Error ? err.message : String(err)}); start it and run the seed again`,
    };
  }
  const stripe = makeStripe({
    STRIPE_SECRET_KEY: env.STRIPE_SECRET_KEY || 'sk_test_ohmstead_local',
    PAYMENTS_API_HOST: host,
    PAYMENTS_API_PORT: port,
    PAYMENTS_API_PROTOCOL: protocol as 'http' | 'https',
  });

  const people = await db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name', 'users.email', 'memberships.roles'])
    .where('memberships.space_id', '=', space.id)
    .orderBy('users.email')
    .execute();
  const steward = people.find((p) => p.roles.includes('steward'));
  const members = people.filter((p) => p.roles.includes('member'));
  if (!steward || members.length === 0)
    return { seeded: false, note: 'demo sales skipped: Quillmere Makers has no steward or no members' };

  const month = shiftMonth(monthOf(clock, space.time_zone), -1);
  const seeded = await seedSalesMonth(
    db,
    { url, stripe },
    { spaceId: space.id, spaceName: space.name, month, appBaseUrl: env.APP_BASE_URL, steward, members },
  );
  return {
    seeded: true,
    note:
      `demo sales seeded: ${seeded.cardSales.length} card and ${seeded.cashSales.length} cash sales in ${month} at Quillmere Makers ` +
      `(one refund, one declined card, one abandoned basket; one charge differs from its sale for the treasurer to find)`,
  };
}
