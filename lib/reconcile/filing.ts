import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import type { Measure, PartCategory, TaxMode } from '@/lib/domain';
import { measureOf } from '@/lib/inventory/measure';
import { writeOffsAtCost } from '@/lib/books/write-offs';
import { boxCounts, type BoxCount } from '@/lib/honour-box/box';
import { lineAmountMinor } from '@/lib/money';
import { moneyRules } from '@/lib/money-rules/settings';
import { purchasesReceived, type PurchaseLine } from '@/lib/restock/purchases';
import { monthRange } from '@/lib/sales/periods';
import { allocateTax } from '@/lib/sales/tax';
import type { Reconciliation } from './report';
import { chargesOfMonth, type ChargeMonthRow } from '@/lib/charges/month';

// The month as an association files it: every sale line (card and cash) with its category and account
// code, net, tax and gross; the tax collected and given back; refunds; the processor's fees; stock
// written off, at cost; purchases received, at the price paid; the honour box's counts and bankings.
// Each is its own section. The sums of the sections equal the Books page's figures (`filingTotals`), which
// tests/integration/money-tax-box.test.ts checks on the demo month.

const MONEY_STATES = ['paid', 'partially_refunded', 'refunded'] as const;
type Range = { from: Date; to: Date };

export type FilingSaleLine = {
  saleId: string;
  partId: string;
  at: Date;
  method: 'card' | 'cash';
  channel: 'counter' | 'honour_box';
  buyer: string | null;
  part: string;
  category: PartCategory;
  accountCode: string;
  /** What qty counts: items, metres or grams (lib/inventory/measure.ts). */
  unit: Measure;
  qty: number;
  /** Units of the line refunded since (for margins: what the buyer kept). */
  refundedQty: number;
  unitPriceMinor: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  taxMode: TaxMode;
  taxRateBp: number;
};

export type FilingRefund = {
  refundId: string;
  saleId: string;
  at: Date;
  method: 'card' | 'cash';
  amountMinor: number;
  taxMinor: number;
  categories: string;
  accountCodes: string;
  restock: boolean;
  processorRefundId: string | null;
};

export type FilingWriteOff = {
  at: Date;
  reason: string;
  part: string;
  category: PartCategory;
  accountCode: string;
  unit: Measure;
  qtyDelta: number;
  /** Units written off: positive for a loss, negative when a count found more than the books held. */
  qty: number;
  /** qty × the price per unit that held then (lib/books/unit-cost.ts); null when the cost is unknown. */
  costMinor: number | null;
  /** Where the cost came from, in words ("at the price last paid", "cost unknown"). */
  costBasis: string;
  note: string;
};

export type FilingPurchase = PurchaseLine & { accountCode: string };

export type Filing = {
  saleLines: FilingSaleLine[];
  refunds: FilingRefund[];
  writeOffs: FilingWriteOff[];
  purchases: FilingPurchase[];
  boxCounts: BoxCount[];
  fees: Reconciliation['fees'];
  /** Charges raised and paid, deposits held, given back and kept (lib/charges/month.ts). */
  charges?: ChargeMonthRow[];
};


/** The month's itemised books; `report` is the month's reconciliation (for the processor's fees). */
export async function filingMonth(db: Db, ctx: Pick<Ctx, 'spaceId'>, report: Reconciliation): Promise<Filing> {
  const { from, to } = monthRange(report.month, report.timeZone);
  const codes = (await moneyRules(db, ctx.spaceId)).accountCodes;
  const codeOf = (c: PartCategory) => codes[c] ?? '';

  const saleLines = await filingSaleLines(db, ctx, { from, to }, codeOf);

  const refundRows = await scoped(db, ctx)
    .selectFrom('refunds')
    .innerJoin('sales', 'sales.id', 'refunds.sale_id')
    .select([
      'refunds.id',
      'refunds.created_at',
      'refunds.amount_minor',
      'refunds.tax_minor',
      'refunds.restock',
      'refunds.lines',
      'refunds.processor_refund_id',
      'sales.id as booked_on',
      'sales.reverses_sale_id',
      'sales.method',
    ])
    .where('refunds.space_id', '=', ctx.spaceId)
    .where('refunds.created_at', '>=', from)
    .where('refunds.created_at', '<', to)
    .orderBy('refunds.created_at')
    .execute();
  const refundLineIds = [...new Set(refundRows.flatMap((r) => r.lines.map((l) => l.saleLineId)))];
  const lineCategory = new Map<string, PartCategory>();
  if (refundLineIds.length) {
    const cats = await scoped(db, ctx)
      .selectFrom('sale_lines')
      .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
      .select(['sale_lines.id', 'parts.category'])
      .where('sale_lines.space_id', '=', ctx.spaceId)
      .where('sale_lines.id', 'in', refundLineIds)
      .execute();
    for (const c of cats) lineCategory.set(c.id, c.category);
  }
  const refunds: FilingRefund[] = refundRows.map((r) => {
    const categories = [...new Set(r.lines.map((l) => lineCategory.get(l.saleLineId)).filter((c): c is PartCategory => Boolean(c)))].sort();
    return {
      refundId: r.id,
      saleId: r.reverses_sale_id ?? r.booked_on,
      at: r.created_at,
      method: r.method,
      amountMinor: r.amount_minor,
      taxMinor: r.tax_minor,
      categories: categories.join('; '),
      accountCodes: [...new Set(categories.map(codeOf).filter(Boolean))].join('; '),
      restock: r.restock,
      processorRefundId: r.processor_refund_id,
    };
  });

  const writeOffs = await writeOffsAtCost(db, ctx, { from, to }, codeOf);
  const purchases = (await purchasesReceived(db, ctx, { from, to })).map((p) => ({ ...p, accountCode: codeOf(p.category) }));

  return {
    saleLines,
    refunds,
    writeOffs,
    purchases,
    boxCounts: (await boxCounts(db, ctx, { from, to, limit: 1000 })).reverse(),
    fees: report.fees,
    charges: (await chargesOfMonth(db, ctx.spaceId, { from, to })).rows,
  };
}

/** Every sale line paid in the range (card and cash, not reversals), with its share of its sale's tax. */
export async function filingSaleLines(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  { from, to }: Range,
  codeOf: (c: PartCategory) => string,
): Promise<FilingSaleLine[]> {
  const lineRows = await scoped(db, ctx)
    .selectFrom('sale_lines')
    .innerJoin('sales', 'sales.id', 'sale_lines.sale_id')
    .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
    .leftJoin('users', 'users.id', 'sales.buyer_id')
    .select([
      'sales.id as sale_id',
      'sales.paid_at',
      'sales.method',
      'sales.channel',
      'sales.tax_mode',
      'sales.tax_rate_bp',
      'sales.tax_minor',
      'sales.total_minor',
      'users.name as buyer',
      'parts.name as part',
      'parts.category',
      'parts.sale_unit',
      'sale_lines.id',
      'sale_lines.qty',
      'sale_lines.refunded_qty',
      'sale_lines.part_id',
      'sale_lines.unit_price_minor',
    ])
    .where('sales.space_id', '=', ctx.spaceId)
    .where('sales.reverses_sale_id', 'is', null)
    .where('sales.status', 'in', MONEY_STATES)
    .where('sales.paid_at', '>=', from)
    .where('sales.paid_at', '<', to)
    .orderBy('sales.paid_at')
    .orderBy('sales.id')
    .orderBy('sale_lines.id')
    .execute();
  const bySale = new Map<string, typeof lineRows>();
  for (const r of lineRows) bySale.set(r.sale_id, [...(bySale.get(r.sale_id) ?? []), r]);
  const saleLines: FilingSaleLine[] = [];
  for (const rows of bySale.values()) {
    // A line's shelf amount: round(qty × unit price), half away from zero (metres and grams may be fractions).
    const shelf = rows.map((r) => lineAmountMinor(r.qty, r.unit_price_minor));
    const shares = allocateTax(shelf, rows[0].tax_minor);
    rows.forEach((r, i) => {
      // Exclusive: the line's shelf amount is its net and its tax share is added. Inclusive: the share
      // is inside the shelf amount. Either way net + tax = gross and a sale's gross lines sum to its total.
      const exclusive = r.tax_mode === 'exclusive';
      const gross = exclusive ? shelf[i] + shares[i] : shelf[i];
      saleLines.push({
        saleId: r.sale_id,
        partId: r.part_id,
        at: r.paid_at!,
        method: r.method,
        channel: r.channel,
        buyer: r.buyer,
        part: r.part,
        category: r.category,
        accountCode: codeOf(r.category),
        unit: measureOf(r.sale_unit),
        qty: Number(r.qty),
        refundedQty: Number(r.refunded_qty),
        unitPriceMinor: r.unit_price_minor,
        netMinor: gross - shares[i],
        taxMinor: shares[i],
        grossMinor: gross,
        taxMode: r.tax_mode,
        taxRateBp: r.tax_rate_bp,
      });
    });
  }
  return saleLines;
}
