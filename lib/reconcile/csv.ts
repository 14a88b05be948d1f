import { writeCsv } from '@/lib/csv';
import { minorUnitExponent } from '@/lib/money';
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

const STATUS_WORDS = {
  matched: 'matched',
  ours_only: 'only in our books',
  theirs_only: 'only at the processor',
  amount_differs: 'amounts differ',
} as const;

/** The reconciliation as CSV: one row per line of the table, the refused payments, then the totals. */
export function reconciliationCsv(r: Reconciliation): string {
  const money = (n: number | null) => decimalAmount(n, r.currency);
  const rows = r.rows.map((x) => ({
    month: r.month,
    status: STATUS_WORDS[x.status],
    kind: x.kind,
    at: x.at,
    sale_id: x.saleId ?? '',
    refund_id: x.refundId ?? '',
    buyer: x.buyer ?? '',
    currency: r.currency,
    ours: money(x.oursMinor),
    processor: money(x.theirsMinor),
    difference: money(x.differenceMinor),
    fee: money(x.feeMinor),
    net: money(x.netMinor),
    processor_id: x.processorId ?? '',
    balance_transaction: x.txnId ?? '',
    note: x.note,
  }));
  const t = r.totals;
  const totals = [
    ['processor gross', t.processor.grossMinor],
    ['processor fees', t.processor.feesMinor],
    ['processor refunds', t.processor.refundsMinor],
    ['processor net', t.processor.netMinor],
    ['paid out', t.processor.paidOutMinor],
    ['our card sales', t.ours.cardMinor],
    ['our cash sales', t.ours.cashMinor],
    ['our card refunds', t.ours.cardRefundsMinor],
    ['our cash refunds', t.ours.cashRefundsMinor],
  ].map(([label, minor]) => ({
    month: r.month,
    status: 'total',
    kind: label as string,
    currency: r.currency,
    ours: money(minor as number),
  }));
  const investigate = r.investigate.map((x) => ({
    month: r.month,
    status: 'to investigate',
    kind: x.type,
    at: x.at,
    sale_id: x.saleId ?? '',
    currency: x.currency ?? '',
    processor: x.amountMinor === null || !x.currency ? '' : decimalAmount(x.amountMinor, x.currency),
    processor_id: x.objectId ?? '',
    note: `Refused: ${x.why}`,
  }));
  return writeCsv(COLUMNS, [...rows, ...investigate, ...totals]);
}

const COLUMNS = [
  'month',
  'status',
  'kind',
  'at',
  'sale_id',
  'refund_id',
  'buyer',
  'currency',
  'ours',
  'processor',
  'difference',
  'fee',
  'net',
  'processor_id',
  'balance_transaction',
  'note',
];
