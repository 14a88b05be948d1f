import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import type { Measure } from '@/lib/domain';
import { now } from '@/lib/clock';
import { boxesOutOfService, type OutOfServiceBox } from '@/lib/kits/upkeep';
import { budgetFigures, type BudgetFigures } from '@/lib/restock/budget';
import { overdueOrders } from '@/lib/restock/orders';
import { whatToOrder } from '@/lib/restock/to-order-query';

export type TodaySummary = {
  myLoans: { id: string; name: string; dueAt: Date; overdue: boolean }[];
  steward?: {
    overdue: number;
    belowReorder: { id: string; name: string; qty: number; reorderPoint: number; saleUnit: Measure }[];
    inRepair: number;
    /** Kit boxes out of service (in repair), each with what it lacks and its last short return. */
    boxesOut: OutOfServiceBox[];
    /** Parts on the to-order list (lib/restock/to-order.ts), and order lists past their expected day. */
    toOrder: number;
    overdueOrders: { id: string; supplierName: string; sentAt: Date; expectedAt: Date }[];
    /** Deposits whose refund the processor has not taken yet (release pending; lib/deposits/jobs.ts retries). */
    releasePending: { loanId: string; item: string; borrower: string | null }[];
  };
  treasurer?: {
    pendingSales: number;
    oldPending: number;
    paidThisMonthMinor: number;
    currency: string;
    /** Restocking this month: received at the price paid, committed, against the monthly budget. */
    restock: BudgetFigures;
  };
  admin?: { people: number; openInvitations: number };
};

/** What needs this person now, in their current space, by role. */
export async function todaySummary(db: Db, ctx: Ctx): Promise<TodaySummary> {
  const at = now();
  const myLoans = await scoped(db, ctx)
    .selectFrom('loans')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select(['loans.id', 'loans.due_at', 'kit_boxes.name as box'])
    .select((eb) =>
      eb
        .selectFrom('loan_lines')
        .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
        .select(sql<string>`string_agg(parts.name, ', ' order by parts.name)`.as('n'))
        .whereRef('loan_lines.loan_id', '=', 'loans.id')
        .as('lines'),
    )
    .where('loans.space_id', '=', ctx.spaceId)
    .where('loans.borrower_id', '=', ctx.userId)
    .where('loans.status', '=', 'out')
    .orderBy('loans.due_at')
    .execute();
  const summary: TodaySummary = {
    myLoans: myLoans.map((l) => ({
      id: l.id,
      name: l.box ?? l.lines ?? 'Loan',
      dueAt: l.due_at,
      overdue: l.due_at < at,
    })),
  };

  if (hasRole(ctx, 'steward', 'admin')) {
    const overdue = await scoped(db, ctx)
      .selectFrom('loans')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .where('status', '=', 'out')
      .where('due_at', '<', at)
      .executeTakeFirstOrThrow();
    const belowReorder = await scoped(db, ctx)
      .selectFrom('parts')
      .leftJoin('stock', 'stock.part_id', 'parts.id')
      .select(['parts.id', 'parts.name', 'parts.reorder_point', 'parts.sale_unit'])
      .select(sql<number>`coalesce(sum(stock.qty), 0)`.as('qty'))
      .where('parts.space_id', '=', ctx.spaceId)
      .where('parts.tracking', '=', 'counted')
      .where('parts.archived_at', 'is', null)
      .where('parts.reorder_point', '>', 0)
      .groupBy('parts.id')
      .having(sql<boolean>`coalesce(sum(stock.qty), 0) < parts.reorder_point`)
      .orderBy('parts.name')
      .limit(20)
      .execute();
    const repair = await scoped(db, ctx)
      .selectFrom('units')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .where('state', '=', 'in_repair')
      .executeTakeFirstOrThrow();
    summary.steward = {
      overdue: overdue.n,
      belowReorder: belowReorder.map((p) => ({
        id: p.id,
        name: p.name,
        qty: p.qty,
        reorderPoint: p.reorder_point,
        saleUnit: p.sale_unit,
      })),
      inRepair: repair.n,
      boxesOut: await boxesOutOfService(db, ctx),
      toOrder: (await whatToOrder(db, ctx)).lineCount,
      overdueOrders: await overdueOrders(db, ctx),
      releasePending: (
        await scoped(db, ctx)
          .selectFrom('deposits')
          .innerJoin('loans', 'loans.id', 'deposits.loan_id')
          .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
          .leftJoin('users', 'users.id', 'loans.borrower_id')
          .select(['deposits.loan_id', 'kit_boxes.name as box', 'users.name as borrower'])
          .where('deposits.status', '=', 'releasing')
          .orderBy('deposits.release_started_at')
          .limit(6)
          .execute()
      ).map((d) => ({ loanId: d.loan_id, item: d.box ?? 'loose parts', borrower: d.borrower })),
    };
  }

  if (hasRole(ctx, 'treasurer')) {
    const space = await db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow();
    const row = await scoped(db, ctx)
      .selectFrom('sales')
      .select([
        sql<number>`count(*) filter (where status = 'pending')::int`.as('pending'),
        sql<number>`count(*) filter (where status = 'pending' and created_at < ${at}::timestamptz - interval '1 hour')::int`.as('old'),
        sql<number>`coalesce(sum(total_minor) filter (where status in ('paid','partially_refunded') and paid_at >= date_trunc('month', ${at}::timestamptz)), 0)::int`.as('paid'),
      ])
      .where('space_id', '=', ctx.spaceId)
      .executeTakeFirstOrThrow();
    summary.treasurer = {
      pendingSales: row.pending,
      oldPending: row.old,
      paidThisMonthMinor: row.paid,
      currency: space.currency.trim(),
      restock: await budgetFigures(db, ctx),
    };
  }

  if (hasRole(ctx, 'admin')) {
    const people = await scoped(db, ctx)
      .selectFrom('memberships')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .executeTakeFirstOrThrow();
    const inv = await scoped(db, ctx)
      .selectFrom('invitations')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .where('accepted_at', 'is', null)
      .where('expires_at', '>', at)
      .executeTakeFirstOrThrow();
    summary.admin = { people: people.n, openInvitations: inv.n };
  }
  return summary;
}
