import { writeCsv } from '@/lib/csv';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { saleRef } from '@/lib/sales/ref';
import { formatRate } from '@/lib/sales/tax';
import { isoInZone } from '@/lib/zoned-time';
import type { Filing } from './filing';
import type { FilingTotals } from './filing-totals';

// The month's books for filing, as CSV (our own column names). Every row names its section first;
// amounts are integer minor units of `currency` (ISO 4217), never decimals, so no rounding happens in
// a spreadsheet; times are ISO 8601 on the space's clock with its offset. The sums of the sections are a
// file of their own (filingTotalsCsv), so no column mixes rows and sums.

export const FILING_SECTIONS = [
  'sale line',
  'tax collected',
  'refund',
  'tax refunded',
  'processor fee',
  'write-off',
  'purchase received',
  'honour box count',
  'honour box banking',
  // Charges and deposits (lib/charges/month.ts): each its own section.
  'charge raised',
  'charge paid',
  'deposit held',
  'deposit kept',
  'deposit given back',
] as const;

const COLUMNS = [
  'section',
  'month',
  'when',
  'sale',
  'method',
  'recorded_at',
  'buyer',
  'supplier',
  'order_list',
  'item',
  'category',
  'account_code',
  'qty',
  'unit',
  'unit_price_minor',
  'net_minor',
  'tax_minor',
  'amount_minor',
  'currency',
  'tax_rule',
  'note',
  'sale_id',
  'processor_ref',
];

type Ctx = { month: string; timeZone: string; currency: string };

export function filingCsv(f: Filing, c: Ctx): string {
  const when = (at: Date | string) => isoInZone(at, c.timeZone);
  const base = { month: c.month, currency: c.currency };
  const rule = (mode: string, bp: number) => (mode === 'exempt' ? 'no tax' : `${mode} ${formatRate(bp)}`);
  const rows: Record<string, unknown>[] = [];
  for (const l of f.saleLines)
    rows.push({
      ...base,
      section: 'sale line',
      when: when(l.at),
      sale: saleRef(l.saleId),
      method: l.method,
      recorded_at: l.channel === 'honour_box' ? 'honour box, by the buyer' : 'counter',
      buyer: l.buyer ?? '',
      item: l.part,
      category: CATEGORY_WORDS[l.category],
      account_code: l.accountCode,
      qty: l.qty,
      unit: l.unit,
      unit_price_minor: l.unitPriceMinor,
      net_minor: l.netMinor,
      tax_minor: l.taxMinor,
      amount_minor: l.grossMinor,
      tax_rule: rule(l.taxMode, l.taxRateBp),
      sale_id: l.saleId,
    });
  const taxBySale = new Map<string, { at: Date; method: string; tax: number; rule: string }>();
  for (const l of f.saleLines) {
    const t = taxBySale.get(l.saleId) ?? { at: l.at, method: l.method, tax: 0, rule: rule(l.taxMode, l.taxRateBp) };
    t.tax += l.taxMinor;
    taxBySale.set(l.saleId, t);
  }
  for (const [saleId, t] of taxBySale)
    if (t.tax !== 0)
      rows.push({
        ...base,
        section: 'tax collected',
        when: when(t.at),
        sale: saleRef(saleId),
        method: t.method,
        tax_minor: t.tax,
        amount_minor: t.tax,
        tax_rule: t.rule,
        sale_id: saleId,
      });
  for (const r of f.refunds)
    rows.push({
      ...base,
      section: 'refund',
      when: when(r.at),
      sale: saleRef(r.saleId),
      method: r.method,
      category: r.categories,
      account_code: r.accountCodes,
      net_minor: r.amountMinor - r.taxMinor,
      tax_minor: r.taxMinor,
      amount_minor: r.amountMinor,
      note: r.restock ? 'items back on the shelf' : 'items not taken back',
      sale_id: r.saleId,
      processor_ref: r.processorRefundId ?? '',
    });
  for (const r of f.refunds)
    if (r.taxMinor !== 0)
      rows.push({
        ...base,
        section: 'tax refunded',
        when: when(r.at),
        sale: saleRef(r.saleId),
        method: r.method,
        tax_minor: r.taxMinor,
        amount_minor: r.taxMinor,
        sale_id: r.saleId,
      });
  for (const x of f.fees)
    rows.push({
      ...base,
      section: 'processor fee',
      when: when(x.at),
      sale: x.saleId ? saleRef(x.saleId) : '',
      method: 'card',
      note: `fee on a ${x.kind}`,
      amount_minor: x.feeMinor,
      sale_id: x.saleId ?? '',
      processor_ref: x.txnId,
    });
  for (const w of f.writeOffs)
    rows.push({
      ...base,
      section: 'write-off',
      when: when(w.at),
      item: w.part,
      category: CATEGORY_WORDS[w.category],
      account_code: w.accountCode,
      // Units written off: positive for a loss, negative when a count found more than the books held.
      qty: w.qty,
      unit: w.unit,
      // At cost (lib/books/unit-cost.ts); blank when the cost is unknown, never a guessed 0.
      amount_minor: w.costMinor ?? '',
      note: [w.reason, w.costBasis, w.note].filter(Boolean).join('; '),
    });
  for (const p of f.purchases)
    rows.push({
      ...base,
      section: 'purchase received',
      when: when(p.receivedAt),
      supplier: p.supplier,
      order_list: p.orderRef,
      item: p.part,
      category: CATEGORY_WORDS[p.category],
      account_code: p.accountCode,
      qty: p.units,
      unit: p.unit,
      // What was paid for the line; the price per unit can be a fraction of a minor unit, so it is not a column.
      amount_minor: p.costMinor,
      note: `packs of ${p.packSize}, listed at ${p.listPackPriceMinor} a pack`,
    });
  for (const b of f.boxCounts) {
    rows.push({
      ...base,
      section: 'honour box count',
      when: when(b.countedAt),
      method: 'cash',
      amount_minor: b.differenceMinor,
      note: `expected ${b.expectedMinor}, counted ${b.countedMinor}${b.countedBy ? `, by ${b.countedBy}` : ''}${b.note ? `: ${b.note}` : ''}`,
    });
    if (b.banking)
      rows.push({
        ...base,
        section: 'honour box banking',
        when: when(b.banking.bankedAt),
        method: 'cash',
        amount_minor: b.banking.amountMinor,
        note: `${b.banking.bankedBy ? `by ${b.banking.bankedBy}` : ''}${b.banking.reference ? ` (ref. ${b.banking.reference})` : ''}`.trim(),
      });
  }
  // Charges and deposits: the person in `buyer`, the processor's id (or ours) in `processor_ref`.
  for (const x of f.charges ?? [])
    rows.push({
      ...base,
      section: x.section,
      when: when(x.at),
      method: x.method,
      buyer: x.person ?? '',
      item: x.item,
      amount_minor: x.amountMinor,
      note: x.note,
      processor_ref: x.ref,
    });
  return writeCsv(COLUMNS, rows);
}

/** One line per section figure: what each section of filingCsv sums to, and the Books page shows. */
export function filingTotalsCsv(t: FilingTotals, c: Ctx): string {
  const figures: [string, string, number][] = [
    ['sale line', 'card sales', t.cardSalesMinor],
    ['sale line', 'cash sales', t.cashSalesMinor],
    ['tax collected', 'tax collected', t.taxCollectedMinor],
    ['refund', 'card refunds', t.cardRefundsMinor],
    ['refund', 'cash refunds', t.cashRefundsMinor],
    ['tax refunded', 'tax given back', t.taxRefundedMinor],
    ['processor fee', 'processor fees', t.processorFeesMinor],
    ['write-off', 'written off at cost', t.writeOffsAtCostMinor],
    ['purchase received', 'purchases received at the price paid', t.purchasesReceivedMinor],
    ['honour box count', 'honour box over (+) or short (−)', t.boxDifferenceMinor],
    ['honour box banking', 'banked from the honour box', t.boxBankedMinor],
    ...t.byCategory.map((x): [string, string, number] => [
      'sale line',
      `sales of ${CATEGORY_WORDS[x.category]}${x.accountCode ? ` (${x.accountCode})` : ''}, before tax`,
      x.netMinor,
    ]),
  ];
  return writeCsv(
    ['month', 'section', 'figure', 'amount_minor', 'currency'],
    figures.map(([section, figure, amount]) => ({ month: c.month, section, figure, amount_minor: amount, currency: c.currency })),
  );
}
