import type { Filing } from '@/lib/reconcile/filing';
import type { FilingTotals } from '@/lib/reconcile/filing-totals';
import { formatDateTime } from '@/lib/format';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatMoney } from '@/lib/money';
import { CARD_TABLE } from '@/components/ui/card-table';
import { Figure } from './figure';

/** The month as an association files it: tax, sales per account code, write-offs and the honour box. */
export function FilingSummary({
  totals,
  filing,
  currency,
  timeZone,
  month,
}: {
  totals: FilingTotals;
  filing: Filing;
  currency: string;
  timeZone: string;
  month: string;
}) {
  const m = (n: number) => formatMoney(n, currency);
  const item = (label: string, value: string, testId?: string) => (
    <Figure key={label} label={label} value={value} testId={testId} />
  );
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {item('Tax collected', m(totals.taxCollectedMinor), 'filing-tax-collected')}
        {item('Tax given back', m(totals.taxRefundedMinor), 'filing-tax-refunded')}
        {item('Honour box over/short', m(totals.boxDifferenceMinor), 'filing-box-difference')}
        {item('Banked from the box', m(totals.boxBankedMinor), 'filing-box-banked')}
      </dl>
      {totals.byCategory.length ? (
        <table className={`w-full ${CARD_TABLE}`}>
          <caption className="mb-1 text-left font-semibold">Sales by category</caption>
          <thead>
            <tr>
              <th scope="col">Category</th>
              <th scope="col">Account code</th>
              <th scope="col">Before tax</th>
              <th scope="col">Tax</th>
              <th scope="col">Paid</th>
            </tr>
          </thead>
          <tbody>
            {totals.byCategory.map((c) => (
              <tr key={c.category}>
                <td data-label="Category">{CATEGORY_WORDS[c.category]}</td>
                <td data-label="Account code" className="font-mono">
                  {c.accountCode || '—'}
                </td>
                <td data-label="Before tax" className="tabular-nums">
                  {m(c.netMinor)}
                </td>
                <td data-label="Tax" className="tabular-nums">
                  {m(c.taxMinor)}
                </td>
                <td data-label="Paid" className="tabular-nums">
                  {m(c.grossMinor)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <div>
        <h3 className="font-semibold">Honour box</h3>
        {filing.boxCounts.length === 0 ? (
          <p className="muted text-sm">Not counted this month.</p>
        ) : (
          <ul className="text-sm" data-testid="filing-box">
            {filing.boxCounts.map((c) => (
              <li key={c.id} className="break-words">
                {formatDateTime(c.countedAt, timeZone)}: expected {m(c.expectedMinor)}, counted {m(c.countedMinor)}
                {c.differenceMinor ? ` (${c.differenceMinor > 0 ? 'over' : 'short'} by ${m(Math.abs(c.differenceMinor))}${c.note ? `: “${c.note}”` : ''})` : ''}
                {c.countedBy ? `, by ${c.countedBy}` : ''}
                {c.banking ? `; banked ${m(c.banking.amountMinor)} on ${formatDateTime(c.banking.bankedAt, timeZone)}` : '; not banked'}
              </li>
            ))}
          </ul>
        )}
      </div>
      <p className="muted text-sm">
        {totals.writeOffLines} stock write-off{totals.writeOffLines === 1 ? '' : 's'} this month (lost, damaged, retired and
        count differences) are listed in the export by quantity; their cost is blank until prices paid are recorded.
      </p>
      <div className="flex flex-wrap gap-2">
        <a href={`/api/books/export?month=${month}&part=filing`} className="btn-quiet" download>
          Books for filing (CSV)
        </a>
        <a href={`/api/books/export?month=${month}&part=filing-totals`} className="btn-quiet" download>
          Their sums (CSV)
        </a>
      </div>
    </div>
  );
}
