import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Measure, SaleStatus, TaxMode } from '@/db/types';
import { moneyRules } from '@/lib/money-rules/settings';
import type { Ctx } from '@/lib/auth/roles';
import { saleFor } from './access';
import { spaceClock } from './periods';
import { saleRef } from './ref';
import { refundState } from './refunds';

export type SaleView = {
  id: string;
  /** Our short reference (lib/sales/ref.ts), shown on receipts and in the books. */
  ref: string;
  /** The space's time zone: the sale's times are shown on its clock, with the zone named. */
  timeZone: string;
  status: SaleStatus;
  method: 'card' | 'cash';
  currency: string;
  totalMinor: number;
  /** The tax inside totalMinor, under the rule the sale was made with; the space's name for its tax. */
  tax: { name: string; mode: TaxMode; rateBp: number; taxMinor: number };
  /** Rung up at the counter, or recorded by the buyer at the honour box. */
  channel: 'counter' | 'honour_box';
  refundedMinor: number;
  createdAt: string;
  paidAt: string | null;
  expiresAt: string | null;
  buyer: string | null;
  cashier: string | null;
  reversesSaleId: string | null;
  paymentIntentId: string | null;
  lines: {
    id: string;
    partId: string;
    name: string;
    qty: number;
    unitPriceMinor: number;
    saleUnit: Measure;
    refundedQty: number;
    leftQty: number;
  }[];
  refunds: {
    id: string;
    amountMinor: number;
    restock: boolean;
    createdAt: string;
    processorRefundId: string | null;
    bookedOn: string;
  }[];
  reversals: { id: string; totalMinor: number; createdAt: string }[];
};

/** One sale as the counter's status page and the books show it (404 unless the caller may see it). */
export async function saleView(db: Db, ctx: Ctx, saleId: string): Promise<SaleView> {
  const sale = await saleFor(db, ctx, saleId);
  const ids = [sale.buyer_id, sale.cashier_id].filter((x): x is string => Boolean(x));
  const people = ids.length
    ? await db.selectFrom('users').select(['id', 'name']).where('id', 'in', ids).execute()
    : [];
  const nameOf = (id: string | null) => people.find((p) => p.id === id)?.name ?? null;
  const names = await scoped(db, ctx)
    .selectFrom('sale_lines')
    .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
    .select(['sale_lines.id', 'parts.name'])
    .where('sale_lines.sale_id', '=', sale.id)
    .execute();
  const state = await refundState(db, sale);
  const reversals = await scoped(db, ctx)
    .selectFrom('sales')
    .select(['id', 'total_minor', 'created_at'])
    .where('reverses_sale_id', '=', sale.id)
    .orderBy('created_at')
    .execute();
  const refunds = await scoped(db, ctx)
    .selectFrom('refunds')
    .select(['id', 'amount_minor', 'restock', 'created_at', 'processor_refund_id', 'sale_id'])
    .where('sale_id', 'in', [sale.id, ...reversals.map((r) => r.id)])
    .orderBy('created_at')
    .execute();
  const { timeZone } = await spaceClock(db, sale.space_id);
  return {
    id: sale.id,
    ref: saleRef(sale.id),
    timeZone,
    status: sale.status,
    method: sale.method,
    currency: sale.currency.trim(),
    totalMinor: sale.total_minor,
    tax: {
      name: (await moneyRules(db, sale.space_id)).taxName,
      mode: sale.tax_mode,
      rateBp: sale.tax_rate_bp,
      taxMinor: sale.tax_minor,
    },
    channel: sale.channel,
    refundedMinor: state.refundedMinor,
    createdAt: sale.created_at.toISOString(),
    paidAt: sale.paid_at?.toISOString() ?? null,
    expiresAt: sale.expires_at?.toISOString() ?? null,
    buyer: nameOf(sale.buyer_id),
    cashier: nameOf(sale.cashier_id),
    reversesSaleId: sale.reverses_sale_id,
    paymentIntentId: sale.payment_intent_id,
    lines: state.lines.map((l) => ({
      id: l.id,
      partId: l.part_id,
      name: names.find((n) => n.id === l.id)?.name ?? 'Part',
      qty: l.qty,
      unitPriceMinor: l.unit_price_minor,
      saleUnit: l.sale_unit,
      refundedQty: l.refunded,
      leftQty: l.left,
    })),
    refunds: refunds.map((r) => ({
      id: r.id,
      amountMinor: r.amount_minor,
      restock: r.restock,
      createdAt: r.created_at.toISOString(),
      processorRefundId: r.processor_refund_id,
      bookedOn: r.sale_id,
    })),
    reversals: reversals.map((r) => ({
      id: r.id,
      totalMinor: r.total_minor,
      createdAt: r.created_at.toISOString(),
    })),
  };
}
