import { writeCsv } from '@/lib/csv';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { isoInZone } from '@/lib/zoned-time';
import type { PurchaseLine } from './purchases';

// The spend export: one row per receipt line of the month, at the price paid. Our own column names;
// `received_at` is ISO 8601 on the space's clock with its offset (a delivery at 21:00 on 30 November in
// Chicago reads as November, as it is booked); amounts are integer minor units of `currency` (ISO 4217),
// so a spreadsheet does no rounding. Rows only: the month's total is the Books page's "spent" figure.

const COLUMNS = [
  'received_at',
  'month',
  'supplier',
  'order_list',
  'item',
  'sku',
  'category',
  'account_code',
  'units',
  'unit',
  'pack_size',
  'listed_pack_price_minor',
  'paid_minor',
  'currency',
  'received_by',
] as const;

export function spendCsv(
  lines: PurchaseLine[],
  c: { month: string; timeZone: string; accountCodes: Partial<Record<string, string>> },
): string {
  return writeCsv(
    COLUMNS,
    lines.map((l) => ({
      received_at: isoInZone(l.receivedAt, c.timeZone),
      month: c.month,
      supplier: l.supplier,
      order_list: l.orderRef,
      item: l.part,
      sku: l.sku,
      category: CATEGORY_WORDS[l.category],
      account_code: c.accountCodes[l.category] ?? '',
      units: l.units,
      // What `units` counts: each, metre or gram (a reel of wire is bought by the metre).
      unit: l.unit,
      pack_size: l.packSize,
      listed_pack_price_minor: l.listPackPriceMinor,
      paid_minor: l.costMinor,
      currency: l.currency,
      received_by: l.receivedBy ?? '',
    })),
  );
}
