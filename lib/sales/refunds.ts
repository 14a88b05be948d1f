import type Stripe from 'stripe';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Sale } from '@/db/types';
import { isId } from '@/lib/ids';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, InvalidError, type FieldErrors } from '@/lib/errors';
import { qtyProblem, roundQty, type Measure } from '@/lib/inventory/measure';
import { lineAmountMinor } from '@/lib/money';
import { saleFor } from './access';
import { isClosedAt } from './periods';
import { processorError } from './processor-errors';
import { refundInput, type RefundInput } from './schemas';
import { returnStock } from './stock';
import { refundAmountForLines, refundTax, type TaxRule } from './tax';

export type RefundLine = { saleLineId: string; qty: number };

type LineState = {
  id: string;
  part_id: string;
  location_id: string | null;
  qty: number;
  unit_price_minor: number;
  sale_unit: Measure;
  refunded: number;
  left: number;
};
export type RefundState = {
  lines: LineState[];
  refundedMinor: number;
  leftMinor: number;
  count: number;
  /** The tax rule the sale was made under, and how much of its tax has gone back (issue 13). */
  rule: TaxRule;
  saleTotalMinor: number;
  saleTaxMinor: number;
  taxLeftMinor: number;
};
type TaxedSale = Pick<Sale, 'id' | 'space_id' | 'total_minor'> &
  Partial<Pick<Sale, 'tax_mode' | 'tax_rate_bp' | 'tax_minor'>>;

/** The refunds of a sale: booked on it, or on its reversing entries. */
export const refundsOfSale = (db: Db, sale: Pick<Sale, 'id' | 'space_id'>) =>
  scoped(db, { spaceId: sale.space_id })
    .selectFrom('refunds')
    .where((eb) =>
      eb.or([
        eb('sale_id', '=', sale.id),
        eb('sale_id', 'in', eb.selectFrom('sales').select('id').where('reverses_sale_id', '=', sale.id)),
      ]),
    );

/**
 * What has been refunded of a sale so far: its own refunds plus those booked on reversing entries
 * (refunds of a sale in a closed month are booked on a reversing sale dated in the open month).
 */
export async function refundState(db: Db, sale: TaxedSale): Promise<RefundState> {
  const refunds = await refundsOfSale(db, sale).select(['amount_minor', 'lines', 'tax_minor']).execute();
  const perLine = new Map<string, number>();
  for (const r of refunds)
    for (const l of r.lines) perLine.set(l.saleLineId, roundQty((perLine.get(l.saleLineId) ?? 0) + l.qty));
  const refundedMinor = refunds.reduce((s, r) => s + r.amount_minor, 0);
  const lines = await scoped(db, { spaceId: sale.space_id })
    .selectFrom('sale_lines')
    .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
    .select([
      'sale_lines.id',
      'sale_lines.part_id',
      'sale_lines.location_id',
      'sale_lines.qty',
      'sale_lines.unit_price_minor',
      'parts.sale_unit',
    ])
    .where('sale_lines.sale_id', '=', sale.id)
    .orderBy('sale_lines.id')
    .execute();
  return {
    lines: lines.map((l) => {
      const refunded = Math.min(l.qty, perLine.get(l.id) ?? 0);
      return { ...l, refunded, left: roundQty(l.qty - refunded) };
    }),
    refundedMinor,
    leftMinor: Math.max(0, sale.total_minor - refundedMinor),
    count: refunds.length,
    rule: { mode: sale.tax_mode ?? 'exempt', rateBp: sale.tax_rate_bp ?? 0 },
    saleTotalMinor: sale.total_minor,
    saleTaxMinor: sale.tax_minor ?? 0,
    taxLeftMinor: Math.max(0, (sale.tax_minor ?? 0) - refunds.reduce((s, r) => s + r.tax_minor, 0)),
  };
}

/** The lines and amount a refund request stands for; a request without lines is everything left. */
export function planRefund(
  state: RefundState,
  lines: RefundLine[] | undefined,
): { lines: RefundLine[]; amountMinor: number } {
  const fields: FieldErrors = {};
  const planned: RefundLine[] = [];
  if (!lines) {
    for (const l of state.lines) if (l.left > 0) planned.push({ saleLineId: l.id, qty: l.left });
  } else {
    const asked = new Map<string, { qty: number; index: number }>();
    lines.forEach((l, index) =>
      asked.set(l.saleLineId, { qty: roundQty((asked.get(l.saleLineId)?.qty ?? 0) + l.qty), index }),
    );
    for (const [saleLineId, { qty, index }] of asked) {
      const line = state.lines.find((l) => l.id === saleLineId);
      const problem = line ? qtyProblem(qty, line.sale_unit) : null;
      if (!line) fields[`lines.${index}.saleLineId`] = ['Not a line of this sale.'];
      else if (problem) fields[`lines.${index}.qty`] = [`The quantity ${problem}.`];
      else if (qty > line.left)
        fields[`lines.${index}.qty`] = [`Only ${line.left} left to refund on this line.`];
      else planned.push({ saleLineId, qty });
    }
  }
  if (Object.keys(fields).length) throw new InvalidError(`Check ${Object.keys(fields).join(', ')}.`, fields);
  const byLine = new Map(state.lines.map((l) => [l.id, l]));
  // Each line's share is round(qty × unit price), half away from zero, as when it was sold.
  const linesMinor = planned.reduce((s, p) => s + lineAmountMinor(p.qty, byLine.get(p.saleLineId)!.unit_price_minor), 0);
  // Lines at shelf prices, plus the tax when it was added at the total (the sale's own rule). When the
  // plan takes back every line still out, it is all the money left, so per-sale rounding leaves no cent.
  const takesAll = state.lines.every(
    (l) => l.left === 0 || planned.some((p) => p.saleLineId === l.id && p.qty >= l.left),
  );
  const amountMinor = takesAll ? state.leftMinor : Math.min(refundAmountForLines(linesMinor, state.rule), state.leftMinor);
  if (amountMinor <= 0) throw new ConflictError('Nothing is left to refund on this sale.');
  return { lines: planned, amountMinor };
}

// ---- processor metadata: the refund carries what it was for, so a webhook can book it on its own ----

export function refundMetadata(input: {
  saleId: string;
  spaceId: string;
  by: string;
  restock: boolean;
  lines: RefundLine[];
}): Record<string, string> {
  const md: Record<string, string> = {
    saleId: input.saleId,
    spaceId: input.spaceId,
    by: input.by,
    restock: input.restock ? '1' : '0',
  };
  input.lines.slice(0, 45).forEach((l, i) => (md[`l${i}`] = `${l.saleLineId}:${l.qty}`));
  return md;
}


export function parseRefundMetadata(md: Record<string, string> | null | undefined) {
  const m = md ?? {};
  const lines: RefundLine[] = [];
  for (const [k, v] of Object.entries(m)) {
    if (!/^l\d+$/.test(k)) continue;
    const [id, qty] = v.split(':');
    if (isId(id) && /^\d+$/.test(qty) && Number(qty) > 0)
      lines.push({ saleLineId: id, qty: Number(qty) });
  }
  return {
    saleId: isId(m.saleId ?? '') ? m.saleId : null,
    by: isId(m.by ?? '') ? m.by : null,
    restock: m.restock === '1',
    lines,
  };
}

// ---- booking a refund (the service and the webhook both come here) ----

export type ApplyRefundInput = {
  processorRefundId: string | null;
  amountMinor: number;
  lines: RefundLine[];
  restock: boolean;
  actorId: string | null;
  source: string;
  /** When the refund happened; default now (demo data passes the processor's time). */
  at?: Date;
};

/**
 * Books a refund on a sale whose row the caller has locked (`select … for update`). Applied once per
 * processor refund id. In an open month the sale's lines and status change; in a closed month the
 * sale is left exactly as it was and a reversing sale dated now carries the refund instead.
 */
export async function applyRefund(
  trx: Db,
  sale: Sale,
  input: ApplyRefundInput,
): Promise<{ applied: boolean; refundId: string | null }> {
  if (input.processorRefundId) {
    const seen = await scoped(trx, { spaceId: sale.space_id })
      .selectFrom('refunds')
      .select('id')
      .where('processor_refund_id', '=', input.processorRefundId)
      .executeTakeFirst();
    if (seen) return { applied: false, refundId: seen.id };
  }
  const state = await refundState(trx, sale);
  // Never more than is left on a line, whatever the request or the processor's metadata says.
  const lines = input.lines
    .map((l) => ({ ...l, qty: Math.min(l.qty, state.lines.find((s) => s.id === l.saleLineId)?.left ?? 0) }))
    .filter((l) => l.qty > 0);
  const at = input.at ?? now();
  const closed = await isClosedAt(trx, sale.space_id, sale.paid_at ?? sale.created_at);
  const taxMinor = refundTax({
    amountMinor: input.amountMinor,
    saleTotalMinor: state.saleTotalMinor,
    saleTaxMinor: state.saleTaxMinor,
    taxLeftMinor: state.taxLeftMinor,
    isAllLeft: input.amountMinor >= state.leftMinor,
  });

  let bookedOn = sale.id;
  if (closed) {
    const reversal = await scoped(trx, { spaceId: sale.space_id })
      .insertInto('sales')
      .values({
        space_id: sale.space_id,
        buyer_id: sale.buyer_id,
        cashier_id: input.actorId,
        method: sale.method,
        status: 'reversed',
        currency: sale.currency,
        total_minor: input.amountMinor,
        tax_mode: sale.tax_mode,
        tax_rate_bp: sale.tax_rate_bp,
        tax_minor: taxMinor,
        channel: sale.channel,
        payment_intent_id: sale.payment_intent_id,
        reverses_sale_id: sale.id,
        created_at: at,
        paid_at: at,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    bookedOn = reversal.id;
    if (lines.length) {
      await scoped(trx, { spaceId: sale.space_id })
        .insertInto('sale_lines')
        .values(
          lines.map((l) => {
            const s = state.lines.find((x) => x.id === l.saleLineId)!;
            return {
              sale_id: reversal.id,
              space_id: sale.space_id,
              part_id: s.part_id,
              location_id: s.location_id,
              qty: l.qty,
              unit_price_minor: s.unit_price_minor,
            };
          }),
        )
        .execute();
    }
  }

  const refund = await scoped(trx, { spaceId: sale.space_id })
    .insertInto('refunds')
    .values({
      space_id: sale.space_id,
      sale_id: bookedOn,
      amount_minor: input.amountMinor,
      tax_minor: taxMinor,
      processor_refund_id: input.processorRefundId,
      restock: input.restock,
      lines: JSON.stringify(lines),
      created_by: input.actorId,
      created_at: at,
    })
    .returning('id')
    .executeTakeFirstOrThrow();

  if (!closed) {
    for (const l of lines) {
      await scoped(trx, { spaceId: sale.space_id })
        .updateTable('sale_lines')
        .set((eb) => ({ refunded_qty: eb('refunded_qty', '+', l.qty) }))
        .where('id', '=', l.saleLineId)
        .where('sale_id', '=', sale.id)
        .execute();
    }
    const refunded = state.refundedMinor + input.amountMinor;
    await scoped(trx, { spaceId: sale.space_id })
      .updateTable('sales')
      .set({ status: refunded >= sale.total_minor ? 'refunded' : 'partially_refunded' })
      .where('id', '=', sale.id)
      .execute();
  }

  let notReturned: { partId: string; qty: number }[] = [];
  if (input.restock && lines.length) {
    notReturned = await returnStock(trx, {
      spaceId: sale.space_id,
      refundId: refund.id,
      actorId: input.actorId,
      ...(input.at ? { at: input.at } : {}),
      lines: lines.map((l) => {
        const s = state.lines.find((x) => x.id === l.saleLineId)!;
        return { partId: s.part_id, locationId: s.location_id, qty: l.qty };
      }),
    });
  }
  await audit(trx, {
    spaceId: sale.space_id,
    actorId: input.actorId,
    action: closed ? 'sale.refunded_by_reversal' : 'sale.refunded',
    targetType: 'sale',
    targetId: sale.id,
    detail: {
      refundId: refund.id,
      amountMinor: input.amountMinor,
      taxMinor,
      lines,
      restock: input.restock,
      processorRefundId: input.processorRefundId,
      source: input.source,
      ...(closed ? { reversalId: bookedOn } : {}),
      ...(notReturned.length ? { notReturned } : {}),
    },
  });
  return { applied: true, refundId: refund.id };
}

const lockSale = (trx: Db, spaceId: string, saleId: string) =>
  scoped(trx, { spaceId }).selectFrom('sales').selectAll().where('id', '=', saleId).forUpdate().executeTakeFirstOrThrow();

/**
 * A refund by the treasurer, full or per line, optionally putting the items back on the shelf. Card
 * money goes back through the processor first, with an idempotency key that a retry of the same
 * request reuses; then the refund is booked in one transaction (the processor's refund webhook books
 * it too if we never got that far, and whichever comes second changes nothing).
 */
export async function refundSale(
  db: Db,
  ctx: Ctx,
  saleId: string,
  raw: RefundInput,
  stripe: Stripe | null,
): Promise<{ refundId: string | null; amountMinor: number; status: string }> {
  if (!hasRole(ctx, 'treasurer')) throw new ForbiddenError('Only the treasurer refunds.');
  const input = refundInput.parse(raw);
  const sale = await saleFor(db, ctx, saleId);
  refundable(sale);
  const book = (
    trx: Db,
    locked: Sale,
    plan: { lines: RefundLine[]; amountMinor: number },
    processorRefundId: string | null,
  ) =>
    applyRefund(trx, locked, {
      processorRefundId,
      amountMinor: plan.amountMinor,
      lines: plan.lines,
      restock: input.restock,
      actorId: ctx.userId,
      source: 'treasurer',
    });
  const statusOf = async (trx: Db) =>
    (await scoped(trx, ctx).selectFrom('sales').select('status').where('id', '=', sale.id).executeTakeFirstOrThrow())
      .status;

  if (sale.method === 'cash') {
    // No processor: plan and book under the sale's lock, so a double click cannot refund twice.
    return db.transaction().execute(async (trx) => {
      const locked = await lockSale(trx, sale.space_id, sale.id);
      refundable(locked);
      const plan = planRefund(await refundState(trx, locked), input.lines);
      const out = await book(trx, locked, plan, null);
      return { refundId: out.refundId, amountMinor: plan.amountMinor, status: await statusOf(trx) };
    });
  }

  if (!sale.payment_intent_id)
    throw new ConflictError(
      'This card sale has no payment on record at the processor; check it in the books.',
    );
  if (!stripe) throw new ConflictError('Card refunds need the card processor.');
  const state = await refundState(db, sale);
  const plan = planRefund(state, input.lines);
  let processorRefundId: string;
  try {
    const refund = await stripe.refunds.create(
      {
        payment_intent: sale.payment_intent_id,
        amount: plan.amountMinor,
        reason: 'requested_by_customer',
        metadata: refundMetadata({
          saleId: sale.id,
          spaceId: sale.space_id,
          by: ctx.userId,
          restock: input.restock,
          lines: plan.lines,
        }),
      },
      // The n-th refund of this sale: a retry of the same request replays instead of refunding twice.
      { idempotencyKey: `ohm-refund-${sale.id}-${state.count + 1}` },
    );
    processorRefundId = refund.id;
  } catch (err) {
    throw processorError(err, 'refund this card payment');
  }
  return db.transaction().execute(async (trx) => {
    const locked = await lockSale(trx, sale.space_id, sale.id);
    const out = await book(trx, locked, plan, processorRefundId);
    return { refundId: out.refundId, amountMinor: plan.amountMinor, status: await statusOf(trx) };
  });
}

function refundable(sale: Sale): void {
  if (sale.status === 'reversed')
    throw new ConflictError('This is a reversing entry; refund the original sale instead.');
  if (!['paid', 'partially_refunded'].includes(sale.status)) {
    throw new ConflictError(`A ${sale.status.replace('_', ' ')} sale has nothing to refund.`);
  }
}

export { lockSale };
