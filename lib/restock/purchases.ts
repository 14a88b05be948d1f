import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import type { Measure, PartCategory } from '@/lib/domain';
import { measureOf } from '@/lib/inventory/measure';

// Purchases received: every receipt line of a period at the price paid (money out, recorded when the
// goods arrive; no processor involved). One reader for the Books' spend beside sales, the filing file's
// "purchase received" section and the spend CSV, so the three always agree.

export type PurchaseLine = {
  receiptLineId: string;
  receivedAt: Date;
  orderId: string;
  /** The order list's short reference, as on its PDF and e-mail. */
  orderRef: string;
  supplier: string;
  part: string;
  sku: string;
  category: PartCategory;
  /** What units counts: items, metres or grams. */
  unit: Measure;
  units: number;
  packSize: number;
  /** The pack price the list was sent with; the price paid may differ (costMinor is what was paid). */
  listPackPriceMinor: number;
  costMinor: number;
  currency: string;
  receivedBy: string | null;
};

export async function purchasesReceived(db: Db, ctx: Pick<Ctx, 'spaceId'>, range: { from: Date; to: Date }): Promise<PurchaseLine[]> {
  const rows = await scoped(db, ctx)
    .selectFrom('order_receipt_lines')
    .innerJoin('order_receipts', 'order_receipts.id', 'order_receipt_lines.receipt_id')
    .innerJoin('order_lines', 'order_lines.id', 'order_receipt_lines.line_id')
    .innerJoin('order_lists', 'order_lists.id', 'order_receipts.order_id')
    .innerJoin('suppliers', 'suppliers.id', 'order_lists.supplier_id')
    .innerJoin('parts', 'parts.id', 'order_receipt_lines.part_id')
    .leftJoin('users', 'users.id', 'order_receipts.received_by')
    .select([
      'order_receipt_lines.id',
      'order_receipts.received_at',
      'order_lists.id as order_id',
      'order_lists.currency',
      'suppliers.name as supplier',
      'parts.name as part',
      'parts.sku',
      'parts.category',
      'parts.sale_unit',
      'order_receipt_lines.units',
      'order_lines.pack_size',
      'order_lines.pack_price_minor',
      'order_receipt_lines.cost_minor',
      'users.name as received_by',
    ])
    .where('order_receipts.received_at', '>=', range.from)
    .where('order_receipts.received_at', '<', range.to)
    .orderBy('order_receipts.received_at')
    .orderBy('order_receipt_lines.id')
    .execute();
  return rows.map((r) => ({
    receiptLineId: r.id,
    receivedAt: r.received_at,
    orderId: r.order_id,
    orderRef: r.order_id.slice(0, 8).toUpperCase(),
    supplier: r.supplier,
    part: r.part,
    sku: r.sku,
    category: r.category,
    unit: measureOf(r.sale_unit),
    units: Number(r.units),
    packSize: Number(r.pack_size),
    listPackPriceMinor: r.pack_price_minor,
    costMinor: r.cost_minor,
    currency: r.currency.trim(),
    receivedBy: r.received_by,
  }));
}
