import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError } from '@/lib/errors';
import { receiveOnShelf } from '@/lib/inventory/receive';
import { findPart } from '@/lib/inventory/scope';
import { inTransaction } from '@/lib/inventory/tx';
import { receivedCostMinor } from './order-words';
import { findOrder, orderLines } from './orders';
import type { OrderReceiveInput } from './schemas';

// Receiving against an order list. One transaction holds the stock (through the same receive service
// the Receive page uses), the new units, the lines' received counts, the receipt at the price paid, the
// list's new state and the audit row: all of it commits, or none.
//
// A double click: the receipt is keyed by the client's idempotency key. The list's row is locked first
// (select … for update), so the second request waits for the first, then finds its receipt and answers
// with the same result, receiving nothing twice. Two stewards receiving the same delivery: each line
// carries how many units the steward's screen showed as received (`receivedBefore`); the line's count
// moves only by a guarded update `… where received_units = receivedBefore`, so the second steward gets a
// 409 naming the line instead of adding the same units again.

export type ReceiptResult = {
  receiptId: string;
  orderId: string;
  state: string;
  lines: { lineId: string; partId: string; units: number; costMinor: number; unitCodes: string[] }[];
  unitCodes: string[];
  costMinor: number;
  replayed: boolean;
};

export async function receiveOrder(db: Db, ctx: Ctx, id: string, input: OrderReceiveInput): Promise<ReceiptResult> {
  if (!input.lines.length && !input.finish) {
    throw new InvalidError('Say what arrived, or that nothing more is coming.', {
      lines: ['enter what arrived on at least one line'],
    });
  }
  return inTransaction(db, async (trx) => {
    const order = await findOrder(trx, ctx, id, true);
    const earlier = await scoped(trx, ctx)
      .selectFrom('order_receipts')
      .select(['order_id', 'result'])
      .where('idempotency_key', '=', input.idempotencyKey)
      .executeTakeFirst();
    if (earlier) {
      if (earlier.order_id !== id) {
        throw new ConflictError('That receipt key belongs to another order list.', {
          idempotencyKey: ['already used for another order list'],
        });
      }
      return { ...(earlier.result as unknown as ReceiptResult), replayed: true };
    }
    if (order.state !== 'sent' && order.state !== 'part_in') {
      throw new ConflictError(
        order.state === 'draft' ? 'This list has not been sent yet.' : 'Nothing more is expected on this list.',
        { state: [`the list is ${order.state}`] },
      );
    }
    const lines = await orderLines(trx, ctx, id);
    const byId = new Map(lines.map((l) => [l.id, l]));
    const seen = new Set<string>();
    input.lines.forEach((l, i) => {
      if (!byId.has(l.lineId)) throw new InvalidError('A line is not on this list.', { [`lines.${i}.lineId`]: ['not a line of this order list'] });
      if (seen.has(l.lineId)) throw new InvalidError('A line appears twice.', { [`lines.${i}.lineId`]: ['this line is already given'] });
      seen.add(l.lineId);
    });

    const receipt = await scoped(trx, ctx)
      .insertInto('order_receipts')
      .values({ space_id: ctx.spaceId, order_id: id, idempotency_key: input.idempotencyKey, received_by: ctx.userId, received_at: now() })
      .returning('id')
      .executeTakeFirstOrThrow();

    const done: ReceiptResult['lines'] = [];
    for (const [i, l] of input.lines.entries()) {
      const line = byId.get(l.lineId)!;
      const moved = await scoped(trx, ctx)
        .updateTable('order_lines')
        .set((eb) => ({ received_units: eb('received_units', '+', l.units) }))
        .where('id', '=', l.lineId)
        .where('received_units', '=', l.receivedBefore)
        .returning('received_units')
        .executeTakeFirst();
      if (!moved) {
        throw new ConflictError(
          `${line.partName}: ${line.receivedUnits} had already been received, not ${l.receivedBefore}. Someone else received this delivery just now; check it again.`,
          { [`lines.${i}.receivedBefore`]: [`${line.receivedUnits} already received`] },
        );
      }
      const part = await findPart(trx, ctx, line.partId);
      const arrival = await receiveOnShelf(trx, ctx, part, {
        qty: l.units,
        qtyField: `lines.${i}.units`,
        locationId: l.locationId,
        note: `order list ${id.slice(0, 8).toUpperCase()}`,
        ref: { type: 'order_list', id },
      });
      const cost = receivedCostMinor(l.units, l.packPriceMinor ?? line.packPriceMinor, line.packSize);
      await scoped(trx, ctx)
        .insertInto('order_receipt_lines')
        .values({
          space_id: ctx.spaceId,
          receipt_id: receipt.id,
          line_id: line.id,
          part_id: line.partId,
          location_id: l.locationId,
          units: l.units,
          cost_minor: cost,
        })
        .execute();
      done.push({ lineId: line.id, partId: line.partId, units: l.units, costMinor: cost, unitCodes: arrival.units.map((u) => u.code) });
    }

    const after = await orderLines(trx, ctx, id);
    const allIn = after.every((l) => l.receivedUnits >= l.orderedUnits);
    const state = input.finish || allIn ? 'all_in' : 'part_in';
    await scoped(trx, ctx)
      .updateTable('order_lists')
      .set({ state, ...(state === 'all_in' ? { closed_at: now() } : {}) })
      .where('id', '=', id)
      .execute();
    const result: ReceiptResult = {
      receiptId: receipt.id,
      orderId: id,
      state,
      lines: done,
      unitCodes: done.flatMap((d) => d.unitCodes),
      costMinor: done.reduce((n, d) => n + d.costMinor, 0),
      replayed: false,
    };
    await scoped(trx, ctx)
      .updateTable('order_receipts')
      .set({ result: JSON.stringify(result) })
      .where('id', '=', receipt.id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.received',
      targetType: 'order_list',
      targetId: id,
      detail: {
        receiptId: receipt.id,
        from: order.state,
        to: state,
        finish: input.finish,
        note: input.note,
        lines: done.map((d) => ({ lineId: d.lineId, partId: d.partId, units: d.units, costMinor: d.costMinor })),
      },
    });
    return result;
  });
}

