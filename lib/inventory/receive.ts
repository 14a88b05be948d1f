import 'server-only';
import type { z } from 'zod';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { InvalidError } from '@/lib/errors';
import { refuseQtyNotInUnit } from './measure-check';
import type { addUnitsSchema, receiveSchema } from './schemas';
import { findLocation, findPart } from './scope';
import { addToBin, recordMovement } from './stock';
import { inTransaction } from './tx';
import { insertUnits } from './units';

// The one way stock arrives on the shelf. The Receive page, the part page's "add units" and receiving
// against an order list all call receiveOnShelf: a counted part goes into a bin (guarded upsert and a
// movement row), a labelled part gets new units with their own codes (and a movement row each).

export type Arrival =
  | { kind: 'counted'; partId: string; locationId: string; qty: number; binQty: number; units: [] }
  | { kind: 'units'; partId: string; locationId: string | null; qty: number; units: { id: string; code: string }[] };

/**
 * Inside the caller's transaction: `qty` of `part` arrive, into `locationId`. The caller writes the audit
 * row (its own words: a receipt, an order's arrival). `ref` names what the stock came against.
 */
export async function receiveOnShelf(
  trx: Db,
  ctx: Ctx,
  part: { id: string; sku: string; tracking: 'counted' | 'unit'; sale_unit?: string },
  input: {
    qty: number;
    /** The field a quantity that does not fit the part's unit is named by (default `qty`). */
    qtyField?: string;
    locationId: string | null;
    note?: string;
    serialPrefix?: string;
    ref?: { type: string; id: string };
  },
): Promise<Arrival> {
  // Labelled units are one thing each; metres and grams may be fractions (migration 0014).
  refuseQtyNotInUnit(input.qty, part.tracking === 'unit' ? 'each' : (part.sale_unit ?? 'each'), input.qtyField ?? 'qty');
  if (input.locationId) await findLocation(trx, ctx, input.locationId);
  if (part.tracking === 'unit') {
    const units = await insertUnits(trx, ctx, part, input.qty, input.locationId, input.serialPrefix, {
      note: input.note,
      refType: input.ref?.type,
      refId: input.ref?.id,
    });
    return { kind: 'units', partId: part.id, locationId: input.locationId, qty: units.length, units };
  }
  if (!input.locationId) {
    throw new InvalidError('Counted stock goes into a bin; choose one.', { locationId: ['choose a bin'] });
  }
  const binQty = await addToBin(trx, ctx, part.id, input.locationId, input.qty);
  await recordMovement(trx, ctx, {
    partId: part.id,
    locationId: input.locationId,
    delta: input.qty,
    reason: 'receive',
    note: input.note ?? '',
    refType: input.ref?.type,
    refId: input.ref?.id,
  });
  return { kind: 'counted', partId: part.id, locationId: input.locationId, qty: input.qty, binQty, units: [] };
}

/** The Receive page: counted stock into a bin, or new labelled units. One transaction with its audit row. */
export async function receiveStock(db: Db, ctx: Ctx, input: z.output<typeof receiveSchema>) {
  return inTransaction(db, async (trx) => {
    const part = await findPart(trx, ctx, input.partId);
    const got = await receiveOnShelf(trx, ctx, part, {
      qty: input.qty,
      locationId: input.locationId,
      note: input.note,
    });
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: got.kind === 'units' ? 'units.added' : 'stock.received',
      targetType: 'part',
      targetId: part.id,
      detail: { locationId: input.locationId, qty: got.qty, ...(got.kind === 'units' ? { count: got.qty } : {}) },
    });
    return {
      partId: part.id,
      locationId: input.locationId,
      // Counted: the bin's new quantity (as before). Labelled: how many units were labelled.
      qty: got.kind === 'counted' ? got.binQty : got.qty,
      units: got.units,
    };
  });
}

/** Labels `count` new units of a labelled part (the part page's "add units"). */
export async function addUnits(db: Db, ctx: Ctx, partId: string, input: z.output<typeof addUnitsSchema>) {
  return inTransaction(db, async (trx) => {
    const part = await findPart(trx, ctx, partId);
    if (part.tracking !== 'unit') {
      throw new InvalidError('This part is counted, not labelled unit by unit; receive stock instead.', {
        count: ['only labelled parts have units'],
      });
    }
    const got = await receiveOnShelf(trx, ctx, part, {
      qty: input.count,
      qtyField: 'count',
      locationId: input.locationId ?? null,
      serialPrefix: input.serialPrefix,
    });
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'units.added',
      targetType: 'part',
      targetId: part.id,
      detail: { count: got.units.length },
    });
    return { units: got.units };
  });
}
