import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { patchSection, readSection } from '@/lib/settings/section';
import { monthOf, monthRange, spaceClock, type Month } from '@/lib/sales/periods';

// The monthly restocking budget (spaces.settings.restocking.monthlyBudgetMinor; null = no budget) and
// the month's figures against it, in the space's calendar month:
//   committed  the ordered value of order lists sent this month and not called off
//   received   what arrived this month at the price paid (order_receipt_lines.cost_minor)

export type BudgetFigures = {
  month: Month;
  currency: string;
  budgetMinor: number | null;
  committedMinor: number;
  receivedMinor: number;
};

type RestockingSettings = { monthlyBudgetMinor: number | null };
const readRestocking = (raw: unknown): RestockingSettings => {
  const value = (raw as Record<string, unknown> | undefined)?.monthlyBudgetMinor;
  return { monthlyBudgetMinor: typeof value === 'number' && Number.isInteger(value) && value >= 0 ? value : null };
};

export async function monthlyBudget(db: Db, spaceId: string): Promise<number | null> {
  return (await readSection(db, spaceId, 'restocking', readRestocking)).monthlyBudgetMinor;
}

export async function budgetFigures(db: Db, ctx: Pick<Ctx, 'spaceId'>, at: Date = now()): Promise<BudgetFigures> {
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  const month = monthOf(at, timeZone);
  const { from, to } = monthRange(month, timeZone);
  const [budgetMinor, committed, received] = await Promise.all([
    monthlyBudget(db, ctx.spaceId),
    scoped(db, ctx)
      .selectFrom('order_lists')
      .innerJoin('order_lines', 'order_lines.order_id', 'order_lists.id')
      .select(sql<number>`coalesce(sum(order_lines.packs * order_lines.pack_price_minor), 0)::int`.as('n'))
      .where('order_lists.state', '<>', 'called_off')
      .where('order_lists.sent_at', '>=', from)
      .where('order_lists.sent_at', '<', to)
      .executeTakeFirstOrThrow(),
    scoped(db, ctx)
      .selectFrom('order_receipt_lines')
      .innerJoin('order_receipts', 'order_receipts.id', 'order_receipt_lines.receipt_id')
      .select(sql<number>`coalesce(sum(order_receipt_lines.cost_minor), 0)::int`.as('n'))
      .where('order_receipts.received_at', '>=', from)
      .where('order_receipts.received_at', '<', to)
      .executeTakeFirstOrThrow(),
  ]);
  return { month, currency, budgetMinor, committedMinor: committed.n, receivedMinor: received.n };
}

/** An admin sets (or clears, with null) the monthly budget; audited with what it was. */
export async function setMonthlyBudget(db: Db, ctx: Ctx, monthlyBudgetMinor: number | null) {
  await patchSection(db, ctx, 'restocking', readRestocking, () => ({ monthlyBudgetMinor }), 'restocking.budget_set');
  return { budget: await budgetFigures(db, ctx) };
}
