import { describe, expect, it } from 'vitest';
import { receivedCostMinor } from '@/lib/restock/order-words';
import { orderCsv } from '@/lib/restock/order-csv';
import type { OrderLine } from '@/lib/restock/orders';

// Money is integer minor units of an ISO 4217 currency (USD: 2 digits after the point, ISO 4217).

describe('what a receipt line cost: units × pack price ÷ pack size, rounded half up to a minor unit', () => {
  it('whole packs are exact: 10 units of packs of 5 at 12.00 → 24.00', () => {
    expect(receivedCostMinor(10, 1200, 5)).toBe(2400);
  });
  it('part of a pack: 6 units of packs of 5 at 13.00 → 15.60 exactly', () => {
    expect(receivedCostMinor(6, 1300, 5)).toBe(1560);
  });
  it('a half cent rounds up: 1 unit of a pack of 4 at 0.10 → 2.5 cents → 3 cents', () => {
    expect(receivedCostMinor(1, 10, 4)).toBe(3);
  });
  it('below a half rounds down: 1 unit of a pack of 3 at 0.10 → 3.33… cents → 3 cents', () => {
    expect(receivedCostMinor(1, 10, 3)).toBe(3);
  });
  it('above a half rounds up: 2 units of a pack of 3 at 0.10 → 6.67 cents → 7 cents', () => {
    expect(receivedCostMinor(2, 10, 3)).toBe(7);
  });
});

const line = (over: Partial<OrderLine>): OrderLine => ({
  id: 'l1',
  partId: 'p1',
  partName: 'Solder spool',
  partSku: 'CON-SOLDER',
  tracking: 'counted',
  saleUnit: 'each',
  itemRef: 'TAL-7',
  packSize: 5,
  packs: 3,
  orderedUnits: 15,
  receivedUnits: 0,
  packPriceMinor: 1200,
  lineTotalMinor: 3600,
  ...over,
});

describe('the order list CSV a supplier receives', () => {
  it('our column names, one row per line, amounts in minor units beside the currency code', () => {
    const csv = orderCsv([line({}), line({ id: 'l2', partName: '=SUM(A1)', itemRef: '', packs: 1, orderedUnits: 5, lineTotalMinor: 1200 })], 'USD');
    const rows = csv.split('\r\n');
    expect(rows[0]).toBe('line,your reference,our SKU,description,packs,pack size,units,price per pack (minor units),line total (minor units),currency');
    expect(rows[1]).toBe('1,TAL-7,CON-SOLDER,Solder spool,3,5,15,1200,3600,USD');
    // Through writeCsv: a cell a spreadsheet would run is kept as text.
    expect(rows[2]).toBe("2,,CON-SOLDER,'=SUM(A1),1,5,5,1200,1200,USD");
  });
});
