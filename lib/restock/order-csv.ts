import { writeCsv } from '@/lib/csv';
import type { OrderLine } from './orders';

// The file a supplier receives with an order list: one row per line, our own column names, amounts in
// minor units of the order's ISO 4217 currency (named in its own column), written through writeCsv.

export const ORDER_CSV_FIELDS = [
  'line',
  'your reference',
  'our SKU',
  'description',
  'packs',
  'pack size',
  'units',
  'price per pack (minor units)',
  'line total (minor units)',
  'currency',
] as const;

export function orderCsv(lines: readonly OrderLine[], currency: string): string {
  return writeCsv(
    ORDER_CSV_FIELDS,
    lines.map((l, i) => [
      i + 1,
      l.itemRef,
      l.partSku,
      l.partName,
      l.packs,
      l.packSize,
      l.orderedUnits,
      l.packPriceMinor,
      l.lineTotalMinor,
      currency,
    ]),
  );
}
