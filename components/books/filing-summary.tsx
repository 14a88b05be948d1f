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
  const item = (label: string, minor: number, testId: string) => (
    <Figure key={label} label={label} value={m(minor)} testId={testId} minor={minor} />
  );
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3">
        {item('Tax collected', totals.taxCollectedMinor, 'filing-tax-collected')}
        {item('Tax given back', totals.taxRefundedMinor, 'filing-tax-refunded')}
        {item('Honour box over/short', totals.boxDifferenceMinor, 'filing-box-difference')}
        {item('Banked from the box', totals.boxBankedMinor, 'filing-box-banked')}
        {item('Purchases received', totals.purchasesReceivedMinor, 'filing-purchases')}
        {item('Written off at cost', totals.writeOffsAtCostMinor, 'filing-write-offs')}
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
      <p className="muted text-sm" data-testid="filing-write-off-words">
        {totals.writeOffLines} stock write-off{totals.writeOffLines === 1 ? '' : 's'} this month (lost, damaged, retired,
        charged damage and count differences), each at the price per unit last paid before it (else the preferred
        offer’s).
        {totals.writeOffsCostUnknown
          ? ` ${totals.writeOffsCostUnknown} of them ha${totals.writeOffsCostUnknown === 1 ? 's' : 've'} no known cost and ${totals.writeOffsCostUnknown === 1 ? 'is' : 'are'} left out of the figure above (blank in the export).`
          : ''}
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
