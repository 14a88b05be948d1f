import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import type { Filing } from '@/lib/reconcile/filing';
import { filingTotals } from '@/lib/reconcile/filing-totals';
import { filingCsv, filingTotalsCsv } from '@/lib/reconcile/filing-csv';

// The filing file's shape on a hand-made month: one exclusive-tax card sale of two lines, one cash
// honour-box line, a refund, a fee, a write-off and a box count. Figures worked by hand beside each check.

const at = new Date('2026-11-30T21:00:00Z'); // 15:00 in Chicago (UTC−06:00)
const filing: Filing = {
  saleLines: [
    // Card sale: lines 100 + 100 at 8.25 % added: tax 16.5 → 17, spread by largest remainder 9 + 8.
    { saleId: '00000000-0000-4000-8000-000000000001', partId: 'p-pad', refundedQty: 0, at, method: 'card', channel: 'counter', buyer: 'Ines', part: 'Pad', category: 'consumable', accountCode: '4010', unit: 'each', qty: 1, unitPriceMinor: 100, netMinor: 100, taxMinor: 9, grossMinor: 109, taxMode: 'exclusive', taxRateBp: 825 },
    { saleId: '00000000-0000-4000-8000-000000000001', partId: 'p-lead', refundedQty: 1, at, method: 'card', channel: 'counter', buyer: 'Ines', part: 'Twin lead', category: 'wire', accountCode: '4020', unit: 'metre', qty: 1, unitPriceMinor: 100, netMinor: 100, taxMinor: 8, grossMinor: 108, taxMode: 'exclusive', taxRateBp: 825 },
    { saleId: '00000000-0000-4000-8000-000000000002', partId: 'p-pad', refundedQty: 0, at, method: 'cash', channel: 'honour_box', buyer: 'Odile', part: 'Pad', category: 'consumable', accountCode: '4010', unit: 'each', qty: 2, unitPriceMinor: 35, netMinor: 70, taxMinor: 0, grossMinor: 70, taxMode: 'exempt', taxRateBp: 0 },
  ],
  refunds: [
    { refundId: 'r1', saleId: '00000000-0000-4000-8000-000000000001', at, method: 'card', amountMinor: 108, taxMinor: 8, categories: 'wire', accountCodes: '4020', restock: true, processorRefundId: 're_1' },
  ],
  writeOffs: [
    // 3 pads crushed at 33 each (the price last paid): 99 written off.
    { at, reason: 'damaged', part: 'Pad', category: 'consumable', accountCode: '4010', unit: 'each', qtyDelta: -3, qty: 3, costMinor: 99, costBasis: 'at the price last paid', note: 'crushed' },
    // A bin count found 2 more than the books held: −66 written off.
    { at, reason: 'count', part: 'Pad', category: 'consumable', accountCode: '4010', unit: 'each', qtyDelta: 2, qty: -2, costMinor: -66, costBasis: 'at the price last paid', note: '' },
    // A lost unit of a part nobody has a price for: cost unknown, left blank.
    { at, reason: 'lost', part: 'Bench supply', category: 'supply', accountCode: '', unit: 'each', qtyDelta: 0, qty: 1, costMinor: null, costBasis: 'cost unknown', note: 'not returned' },
  ],
  purchases: [
    { receiptLineId: 'rl1', receivedAt: at, orderId: 'ab12cd34-0000-4000-8000-000000000009', orderRef: 'AB12CD34', supplier: 'Tallowmere Components', part: 'Pad', sku: 'PAD', category: 'consumable', accountCode: '4010', unit: 'each', units: 30, packSize: 10, listPackPriceMinor: 330, costMinor: 1000, currency: 'USD', receivedBy: 'Odile' },
    { receiptLineId: 'rl2', receivedAt: at, orderId: 'ab12cd34-0000-4000-8000-000000000009', orderRef: 'AB12CD34', supplier: 'Tallowmere Components', part: 'Twin lead', sku: 'LEAD', category: 'wire', accountCode: '4020', unit: 'metre', units: 25, packSize: 25, listPackPriceMinor: 1037, costMinor: 1037, currency: 'USD', receivedBy: 'Odile' },
  ],
  boxCounts: [
    { id: 'c1', countedAt: at.toISOString(), countedBy: 'Odile', since: null, carriedMinor: 0, cashSalesMinor: 70, cashRefundsMinor: 0, expectedMinor: 70, countedMinor: 60, differenceMinor: -10, note: 'short', banking: { id: 'b1', amountMinor: 60, reference: 'Slip 1', bankedAt: at.toISOString(), bankedBy: 'Odile' } },
  ],
  fees: [{ txnId: 'txn_1', kind: 'charge', at: at.toISOString(), feeMinor: 36, saleId: '00000000-0000-4000-8000-000000000001' }],
};

describe('the filing CSV', () => {
  const rows = Papa.parse<Record<string, string>>(filingCsv(filing, { month: '2026-11', timeZone: 'America/Chicago', currency: 'USD' }), {
    header: true,
    skipEmptyLines: true,
  }).data;
  const sum = (section: string) =>
    rows.filter((r) => r.section === section).reduce((s, r) => s + (r.amount_minor === '' ? 0 : Number(r.amount_minor)), 0);

  it('has each section, amounts in minor units, times on the space’s clock with its offset', () => {
    expect([...new Set(rows.map((r) => r.section))]).toEqual([
      'sale line',
      'tax collected',
      'refund',
      'tax refunded',
      'processor fee',
      'write-off',
      'purchase received',
      'honour box count',
      'honour box banking',
    ]);
    expect(rows[0].when).toBe('2026-11-30T15:00:00-06:00');
    expect(rows[0]).toMatchObject({ account_code: '4010', net_minor: '100', tax_minor: '9', amount_minor: '109', currency: 'USD', tax_rule: 'exclusive 8.25 %' });
  });

  it('sums by hand: sales 109 + 108 + 70 = 287; tax 17; refunds 108 (tax 8); fee 36; write-offs 99 − 66 = 33; purchases 1000 + 1037 = 2037; box −10 and 60 banked', () => {
    expect(sum('sale line')).toBe(287);
    expect(sum('tax collected')).toBe(17);
    expect(sum('refund')).toBe(108);
    expect(sum('tax refunded')).toBe(8);
    expect(sum('processor fee')).toBe(36);
    expect(sum('honour box count')).toBe(-10);
    expect(sum('honour box banking')).toBe(60);
    expect(sum('write-off')).toBe(33);
    expect(sum('purchase received')).toBe(2037);
    const t = filingTotals(filing);
    expect(t).toMatchObject({
      cardSalesMinor: 217,
      cashSalesMinor: 70,
      taxCollectedMinor: 17,
      taxRefundedMinor: 8,
      cardRefundsMinor: 108,
      cashRefundsMinor: 0,
      processorFeesMinor: 36,
      boxDifferenceMinor: -10,
      boxBankedMinor: 60,
      writeOffLines: 3,
      writeOffsAtCostMinor: 33,
      writeOffsCostUnknown: 1,
      purchasesReceivedMinor: 2037,
    });
    const totals = Papa.parse<Record<string, string>>(filingTotalsCsv(t, { month: '2026-11', timeZone: 'America/Chicago', currency: 'USD' }), {
      header: true,
      skipEmptyLines: true,
    }).data;
    const figure = (name: string) => totals.find((r) => r.figure === name)?.amount_minor;
    expect(figure('written off at cost')).toBe('33');
    expect(figure('purchases received at the price paid')).toBe('2037');
  });

  it('names the unit of every quantity (metres and grams may be fractions), and none where there is no quantity', () => {
    const lines = rows.filter((r) => r.section === 'sale line');
    expect(lines.map((r) => [r.item, r.qty, r.unit])).toEqual([
      ['Pad', '1', 'each'],
      ['Twin lead', '1', 'metre'],
      ['Pad', '2', 'each'],
    ]);
    expect(rows.filter((r) => r.section === 'purchase received').map((r) => r.unit)).toEqual(['each', 'metre']);
    expect(rows.filter((r) => r.section === 'write-off').every((r) => r.unit === 'each')).toBe(true);
    expect(rows.filter((r) => r.section === 'tax collected').every((r) => r.unit === '')).toBe(true);
  });

  it('values write-offs at cost, and leaves an unknown cost blank (never 0) saying so', () => {
    const w = rows.filter((r) => r.section === 'write-off');
    expect(w[0]).toMatchObject({ qty: '3', amount_minor: '99', account_code: '4010', note: 'damaged; at the price last paid; crushed' });
    expect(w[1]).toMatchObject({ qty: '-2', amount_minor: '-66' });
    expect(w[2]).toMatchObject({ qty: '1', amount_minor: '', item: 'Bench supply' });
    expect(w[2].note).toContain('cost unknown');
  });

  it('lists purchases received at the price paid, with the supplier and the order list, on the space’s clock', () => {
    const p = rows.filter((r) => r.section === 'purchase received');
    expect(p[0]).toMatchObject({
      when: '2026-11-30T15:00:00-06:00',
      supplier: 'Tallowmere Components',
      order_list: 'AB12CD34',
      item: 'Pad',
      account_code: '4010',
      qty: '30',
      amount_minor: '1000',
      currency: 'USD',
    });
  });
});

describe('the filing CSV: charges and deposits (issue 16)', () => {
  const withCharges: Filing = {
    ...filing,
    charges: [
      { section: 'charge raised', at, person: 'Ines', item: 'Test meter', method: '', amountMinor: 2500, note: 'damaged', ref: 'ch-1' },
      { section: 'charge paid', at, person: 'Ines', item: 'towards charges', method: 'card', amountMinor: 2500, note: '', ref: 'pi_9' },
      { section: 'deposit held', at, person: 'Odile', item: 'deposit for Box 1', method: 'card', amountMinor: 5000, note: '', ref: 'pi_8' },
      { section: 'deposit kept', at, person: 'Odile', item: 'deposit for Box 1', method: '', amountMinor: 1200, note: 'kept for charges', ref: 'd-1' },
      { section: 'deposit given back', at, person: 'Odile', item: 'deposit for Box 1', method: 'card', amountMinor: 3800, note: '', ref: 're_7' },
    ],
  };
  const rows = Papa.parse<Record<string, string>>(filingCsv(withCharges, { month: '2026-11', timeZone: 'America/Chicago', currency: 'USD' }), {
    header: true,
    skipEmptyLines: true,
  }).data;

  it('puts each in its own section after the others, with the person, amount in minor units and the processor’s id', () => {
    const own = rows.filter((r) => ['charge raised', 'charge paid', 'deposit held', 'deposit kept', 'deposit given back'].includes(r.section));
    expect(own.map((r) => [r.section, r.buyer, r.method, r.amount_minor, r.processor_ref])).toEqual([
      ['charge raised', 'Ines', '', '2500', 'ch-1'],
      ['charge paid', 'Ines', 'card', '2500', 'pi_9'],
      ['deposit held', 'Odile', 'card', '5000', 'pi_8'],
      ['deposit kept', 'Odile', '', '1200', 'd-1'],
      ['deposit given back', 'Odile', 'card', '3800', 're_7'],
    ]);
    expect(own[0].when).toBe('2026-11-30T15:00:00-06:00');
    // Held 50.00 = kept 12.00 + given back 38.00.
    expect(Number(own[2].amount_minor)).toBe(Number(own[3].amount_minor) + Number(own[4].amount_minor));
    expect(rows.slice(-5)).toEqual(own);
  });
});
