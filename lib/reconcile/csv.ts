import { writeCsv } from '@/lib/csv';
import { minorUnitExponent } from '@/lib/money';
import { saleRef } from '@/lib/sales/ref';
import { isoInZone } from '@/lib/zoned-time';
import type { Reconciliation } from './report';

/** Minor units as a plain decimal for spreadsheets ("12.50", JPY "1250"); exponent per ISO 4217. */
export function decimalAmount(minor: number | null, currency: string): string {
  if (minor === null) return '';
  const exp = minorUnitExponent(currency);
  const sign = minor < 0 ? '-' : '';
  const abs = Math.abs(minor);
  if (exp === 0) return `${sign}${abs}`;
  const s = String(abs).padStart(exp + 1, '0');
  return `${sign}${s.slice(0, -exp)}.${s.slice(-exp)}`;
}

const STATE_WORDS = {
  matched: 'matched',
  ours_only: 'only in our books',
  theirs_only: 'only at the processor',
  amount_differs: 'amounts differ',
} as const;

const ENTRY_WORDS = { charge: 'sale payment', refund: 'refund' } as const;

// Our own column names. Times are the space's wall clock with the offset (ISO 8601), so a sale at
// 21:00 on 30 November in Chicago reads as November, as it is booked. The file holds rows only:
// the month's totals are a file of their own (totalsCsv), so summing a column never counts twice.
const COLUMNS = [
  'month',
  'state',
  'entry',
  'when',
  'sale',
  'buyer',
  'currency',
  'our_amount',
  'processor_amount',
  'difference',
  'processor_fee',
  'after_fee',
  'note',
  'resolution',
  'resolved_by',
  'resolved_at',
  'sale_id',
  'processor_payment_ref',
  'processor_ledger_ref',
];

/** The month's reconciliation as CSV: one line per row of the table, then the refused payments. */
export function reconciliationCsv(r: Reconciliation): string {
  const money = (n: number | null) => decimalAmount(n, r.currency);
  const when = (at: string) => isoInZone(at, r.timeZone);
  const rows = r.rows.map((x) => ({
    month: r.month,
    state: STATE_WORDS[x.status],
    entry: x.chargePayment ? 'charges paid by card' : x.deposit ? (x.kind === 'charge' ? 'deposit taken' : 'deposit given back') : ENTRY_WORDS[x.kind],
    when: when(x.at),
    sale: x.saleRef ?? '',
    buyer: x.buyer ?? '',
    currency: r.currency,
    our_amount: money(x.oursMinor),
    processor_amount: money(x.theirsMinor),
    difference: money(x.differenceMinor),
    processor_fee: money(x.feeMinor),
    after_fee: money(x.netMinor),
    note: x.note,
    resolution: x.resolution?.note ?? '',
    resolved_by: x.resolution?.writtenBy ?? '',
    resolved_at: x.resolution ? when(x.resolution.writtenAt) : '',
    sale_id: x.saleId ?? '',
    processor_payment_ref: x.processorId ?? '',
    processor_ledger_ref: x.txnId ?? '',
  }));
  const investigate = r.investigate.map((x) => ({
    month: r.month,
    state: 'to investigate',
    entry: 'refused payment',
    when: when(x.at),
    sale: x.saleId ? saleRef(x.saleId) : '',
    currency: x.currency ?? '',
    processor_amount: x.amountMinor === null || !x.currency ? '' : decimalAmount(x.amountMinor, x.currency),
    note: `Refused: ${x.why}`,
    sale_id: x.saleId ?? '',
    processor_payment_ref: x.objectId ?? '',
  }));
  return writeCsv(COLUMNS, [...rows, ...investigate]);
}

/** The month's totals, a file of their own: one figure per line, in our words. */
export function totalsCsv(r: Reconciliation): string {
  const t = r.totals;
  const figures: [string, string, number][] = [
    ['processor', 'card money taken', t.processor.grossMinor],
    ['processor', 'processor fees', t.processor.feesMinor],
    ['processor', 'card money given back', t.processor.refundsMinor],
    ['processor', 'left after fees and refunds', t.processor.netMinor],
    ['processor', 'sent to the bank', t.processor.paidOutMinor],
    ['our books', 'card sales', t.ours.cardMinor],
    ['our books', 'cash sales (honour box)', t.ours.cashMinor],
    ['our books', 'card refunds', t.ours.cardRefundsMinor],
    ['our books', 'cash refunds', t.ours.cashRefundsMinor],
    ['our books', 'deposits taken', t.ours.depositsMinor],
    ['our books', 'deposits given back', t.ours.depositReleasesMinor],
    ['our books', 'charges', t.ours.chargesMinor],
    ['our books', 'charges kept from deposits', t.ours.chargesFromDepositsMinor],
  ];
  return writeCsv(
    ['month', 'side', 'figure', 'amount', 'currency'],
    figures.map(([side, figure, minor]) => ({
      month: r.month,
      side,
      figure,
      amount: decimalAmount(minor, r.currency),
      currency: r.currency,
    })),
  );
}
