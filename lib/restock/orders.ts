import 'server-only';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { OrderState } from '@/db/types';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { roundQty, type Measure } from '@/lib/inventory/measure';
import { assertId } from '@/lib/inventory/scope';
import { inTransaction } from '@/lib/inventory/tx';
import { budgetFigures, type BudgetFigures } from './budget';
import type { orderCreateSchema, orderPatchSchema } from './schemas';
import { findSupplier, requireBuyer } from './suppliers';

// Order lists: one per supplier, put together from the to-order list (or by hand), then sent, received
// against (lib/restock/receive-order.ts) or called off. Each change is one transaction with its audit row;
// a change to an existing list first locks its row (select … for update), so two stewards acting on one
// list at once take turns and the second sees the first's result.

export type OrderLine = {
  id: string;
  partId: string;
  partName: string;
  partSku: string;
  tracking: 'counted' | 'unit';
  saleUnit: Measure;
  itemRef: string;
  packSize: number;
  packs: number;
  orderedUnits: number;
  receivedUnits: number;
  packPriceMinor: number;
  lineTotalMinor: number;
};

export type OrderDetail = {
  id: string;
  state: OrderState;
  currency: string;
  note: string;
  supplier: { id: string; name: string; email: string; website: string; leadDays: number; minOrderMinor: number };
  createdAt: Date;
  sentAt: Date | null;
  expectedAt: Date | null;
  overdue: boolean;
  approvedAt: Date | null;
  approvalNote: string | null;
  cancelNote: string | null;
  lines: OrderLine[];
  totalMinor: number;
  receipts: { id: string; receivedAt: Date; by: string | null; units: number; costMinor: number }[];
  receivedCostMinor: number;
};

/** The order's row, locked for the rest of the transaction when `lock` (a change is coming). */
export async function findOrder(db: Db, ctx: Ctx, id: string, lock = false) {
  requireBuyer(ctx);
  assertId(id, 'order list');
  const row = await scoped(db, ctx)
    .selectFrom('order_lists')
    .selectAll()
    .where('id', '=', id)
    .$if(lock, (qb) => qb.forUpdate())
    .executeTakeFirst();
  if (!row) throw new NotFoundError('No such order list.');
  return row;
}

export async function orderLines(db: Db, ctx: Ctx, orderId: string): Promise<OrderLine[]> {
  const rows = await scoped(db, ctx)
    .selectFrom('order_lines')
    .innerJoin('parts', 'parts.id', 'order_lines.part_id')
    .select([
      'order_lines.id',
      'order_lines.part_id',
      'order_lines.item_ref',
      'order_lines.pack_size',
      'order_lines.packs',
      'order_lines.pack_price_minor',
      'order_lines.received_units',
      'parts.name',
      'parts.sku',
      'parts.tracking',
      'parts.sale_unit',
    ])
    .where('order_lines.order_id', '=', orderId)
    .orderBy('parts.name')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    partId: r.part_id,
    partName: r.name,
    partSku: r.sku,
    tracking: r.tracking,
    saleUnit: r.sale_unit,
    itemRef: r.item_ref,
    packSize: r.pack_size,
    packs: r.packs,
    orderedUnits: roundQty(r.packs * r.pack_size),
    receivedUnits: r.received_units,
    packPriceMinor: r.pack_price_minor,
    lineTotalMinor: r.packs * r.pack_price_minor,
  }));
}

export async function orderDetail(db: Db, ctx: Ctx, id: string): Promise<OrderDetail> {
  const order = await findOrder(db, ctx, id);
  const supplier = await findSupplier(db, ctx, order.supplier_id);
  const [lines, receipts] = await Promise.all([
    orderLines(db, ctx, id),
    scoped(db, ctx)
      .selectFrom('order_receipts')
      .leftJoin('users', 'users.id', 'order_receipts.received_by')
      .select(['order_receipts.id', 'order_receipts.received_at', 'users.name as by'])
      .select((eb) => [
        eb
          .selectFrom('order_receipt_lines')
          .select((e) => e.fn.coalesce(e.fn.sum<number>('units'), e.lit(0)).as('n'))
          .whereRef('order_receipt_lines.receipt_id', '=', 'order_receipts.id')
          .as('units'),
        eb
          .selectFrom('order_receipt_lines')
          .select((e) => e.fn.coalesce(e.fn.sum<number>('cost_minor'), e.lit(0)).as('n'))
          .whereRef('order_receipt_lines.receipt_id', '=', 'order_receipts.id')
          .as('cost'),
      ])
      .where('order_receipts.order_id', '=', id)
      .orderBy('order_receipts.received_at')
      .execute(),
  ]);
  const at = now();
  const rs = receipts.map((r) => ({
    id: r.id,
    receivedAt: r.received_at,
    by: r.by,
    units: Number(r.units ?? 0),
    costMinor: Number(r.cost ?? 0),
  }));
  return {
    id: order.id,
    state: order.state,
    currency: order.currency.trim(),
    note: order.note,
    supplier: {
      id: supplier.id,
      name: supplier.name,
      email: supplier.email,
      website: supplier.website,
      leadDays: supplier.lead_days,
      minOrderMinor: supplier.min_order_minor,
    },
    createdAt: order.created_at,
    sentAt: order.sent_at,
    expectedAt: order.expected_at,
    overdue: isOverdue(order, at),
    approvedAt: order.approved_at,
    approvalNote: order.approval_note,
    cancelNote: order.cancel_note,
    lines,
    totalMinor: lines.reduce((n, l) => n + l.lineTotalMinor, 0),
    receipts: rs,
    receivedCostMinor: rs.reduce((n, r) => n + r.costMinor, 0),
  };
}

/** Sent (or part arrived) and past the day the supplier's lead time said it would come. */
export const isOverdue = (o: { state: OrderState; expected_at: Date | null }, at: Date) =>
  (o.state === 'sent' || o.state === 'part_in') && o.expected_at !== null && o.expected_at < at;

export type OrderSummary = {
  id: string;
  state: OrderState;
  supplierName: string;
  createdAt: Date;
  sentAt: Date | null;
  expectedAt: Date | null;
  overdue: boolean;
  lineCount: number;
  totalMinor: number;
  currency: string;
};

export async function listOrders(db: Db, ctx: Ctx): Promise<{ orders: OrderSummary[]; budget: BudgetFigures }> {
  requireBuyer(ctx);
  const rows = await scoped(db, ctx)
    .selectFrom('order_lists')
    .innerJoin('suppliers', 'suppliers.id', 'order_lists.supplier_id')
    .select([
      'order_lists.id',
      'order_lists.state',
      'order_lists.created_at',
      'order_lists.sent_at',
      'order_lists.expected_at',
      'order_lists.currency',
      'suppliers.name as supplier_name',
    ])
    .select((eb) => [
      eb
        .selectFrom('order_lines')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('order_lines.order_id', '=', 'order_lists.id')
        .as('lineCount'),
      eb
        .selectFrom('order_lines')
        .select((e) => e.fn.coalesce(e.fn.sum<number>(e('packs', '*', e.ref('pack_price_minor'))), e.lit(0)).as('n'))
        .whereRef('order_lines.order_id', '=', 'order_lists.id')
        .as('total'),
    ])
    .orderBy('order_lists.created_at', 'desc')
    .limit(200)
    .execute();
  const at = now();
  return {
    orders: rows.map((r) => ({
      id: r.id,
      state: r.state,
      supplierName: r.supplier_name,
      createdAt: r.created_at,
      sentAt: r.sent_at,
      expectedAt: r.expected_at,
      overdue: isOverdue(r, at),
      lineCount: Number(r.lineCount ?? 0),
      totalMinor: Number(r.total ?? 0),
      currency: r.currency.trim(),
    })),
    budget: await budgetFigures(db, ctx),
  };
}

/** Sent lists past their expected day, oldest first (the steward's Today card). */
export async function overdueOrders(db: Db, ctx: Ctx) {
  const rows = await scoped(db, ctx)
    .selectFrom('order_lists')
    .innerJoin('suppliers', 'suppliers.id', 'order_lists.supplier_id')
    .select(['order_lists.id', 'order_lists.expected_at', 'order_lists.sent_at', 'suppliers.name'])
    .where('order_lists.state', 'in', ['sent', 'part_in'])
    .where('order_lists.expected_at', '<', now())
    .orderBy('order_lists.expected_at')
    .limit(20)
    .execute();
  return rows.map((r) => ({ id: r.id, supplierName: r.name, sentAt: r.sent_at!, expectedAt: r.expected_at! }));
}

/** Lines priced from the supplier's offers; a part the supplier does not offer is a 400 naming its line. */
async function pricedLines(trx: Db, ctx: Ctx, supplierId: string, lines: { partId: string; packs: number }[]) {
  const seen = new Set<string>();
  lines.forEach((l, i) => {
    if (seen.has(l.partId)) throw new InvalidError('A part appears twice.', { [`lines.${i}.partId`]: ['this part is already on the list'] });
    seen.add(l.partId);
  });
  const offers = await scoped(trx, ctx)
    .selectFrom('supplier_offers')
    .select(['part_id', 'item_ref', 'pack_size', 'pack_price_minor'])
    .where('supplier_id', '=', supplierId)
    .where(
      'part_id',
      'in',
      lines.map((l) => l.partId),
    )
    .execute();
  const byPart = new Map(offers.map((o) => [o.part_id, o]));
  return lines.map((l, i) => {
    const o = byPart.get(l.partId);
    if (!o) {
      throw new InvalidError('That supplier has no offer for one of the parts.', {
        [`lines.${i}.partId`]: ['this supplier has no offer for this part; add one under Suppliers'],
      });
    }
    return {
      space_id: ctx.spaceId,
      part_id: l.partId,
      item_ref: o.item_ref,
      pack_size: o.pack_size,
      packs: l.packs,
      pack_price_minor: o.pack_price_minor,
    };
  });
}

export async function createOrder(db: Db, ctx: Ctx, input: z.output<typeof orderCreateSchema>) {
  requireBuyer(ctx);
  return inTransaction(db, async (trx) => {
    const supplier = await findSupplier(trx, ctx, input.supplierId);
    if (supplier.archived_at) {
      throw new ConflictError('That supplier is archived.', { supplierId: ['this supplier is archived'] });
    }
    const lines = await pricedLines(trx, ctx, supplier.id, input.lines);
    const space = await trx.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow();
    const order = await scoped(trx, ctx)
      .insertInto('order_lists')
      .values({
        space_id: ctx.spaceId,
        supplier_id: supplier.id,
        currency: space.currency.trim(),
        note: input.note,
        created_by: ctx.userId,
      })
      .returning(['id'])
      .executeTakeFirstOrThrow();
    await scoped(trx, ctx)
      .insertInto('order_lines')
      .values(lines.map((l) => ({ ...l, order_id: order.id })))
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.created',
      targetType: 'order_list',
      targetId: order.id,
      detail: { supplierId: supplier.id, lines: input.lines },
    });
    return { order: { id: order.id, state: 'draft' as const } };
  });
}

/** Only a draft changes: its lines (the whole list; a part left out is dropped) and its note. */
export async function updateOrder(db: Db, ctx: Ctx, id: string, patch: z.output<typeof orderPatchSchema>) {
  requireBuyer(ctx);
  return inTransaction(db, async (trx) => {
    const order = await findOrder(trx, ctx, id, true);
    if (order.state !== 'draft') {
      throw new ConflictError('Only a list being put together can change; this one has been sent.', {
        state: [`the list is ${order.state}`],
      });
    }
    if (patch.lines) {
      const lines = await pricedLines(trx, ctx, order.supplier_id, patch.lines);
      await scoped(trx, ctx).deleteFrom('order_lines').where('order_id', '=', id).execute();
      await scoped(trx, ctx)
        .insertInto('order_lines')
        .values(lines.map((l) => ({ ...l, order_id: id })))
        .execute();
    }
    if (patch.note !== undefined) {
      await scoped(trx, ctx).updateTable('order_lists').set({ note: patch.note }).where('id', '=', id).execute();
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.updated',
      targetType: 'order_list',
      targetId: id,
      detail: { ...patch },
    });
    return { order: await orderDetail(trx, ctx, id) };
  });
}

/** Called off: nothing more is expected. What arrived before stays on the shelf and in the spend. */
export async function cancelOrder(db: Db, ctx: Ctx, id: string, note: string) {
  requireBuyer(ctx);
  return inTransaction(db, async (trx) => {
    const order = await findOrder(trx, ctx, id, true);
    if (order.state === 'all_in' || order.state === 'called_off') {
      throw new ConflictError(
        order.state === 'all_in' ? 'Everything on this list has arrived; there is nothing to call off.' : 'This list is already called off.',
        { state: [`the list is ${order.state}`] },
      );
    }
    const lines = await orderLines(trx, ctx, id);
    await scoped(trx, ctx)
      .updateTable('order_lists')
      .set({ state: 'called_off', closed_at: now(), cancel_note: note })
      .where('id', '=', id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.called_off',
      targetType: 'order_list',
      targetId: id,
      detail: {
        from: order.state,
        note,
        kept: lines.filter((l) => l.receivedUnits > 0).map((l) => ({ partId: l.partId, units: l.receivedUnits })),
      },
    });
    return { order: await orderDetail(trx, ctx, id) };
  });
}
