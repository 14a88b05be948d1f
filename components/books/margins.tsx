import type { CategoryMargin } from '@/lib/books/margins';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatMoney } from '@/lib/money';
import { CARD_TABLE } from '@/components/ui/card-table';

/** The month's margin per category: sold before tax, its cost, the margin; unknown costs said plainly. */
export function Margins({ rows, currency, label }: { rows: CategoryMargin[]; currency: string; label: string }) {
  const m = (n: number) => formatMoney(n, currency);
  return (
    <section aria-labelledby="margins" className="card space-y-3">
      <h2 id="margins" className="text-lg font-bold">
        Margins on what was sold, {label}
      </h2>
      <p className="muted text-sm">
        Sold: sales paid this month before tax, less what was refunded. Cost: each line’s units at the price per unit last
        paid on receiving before the sale; if nothing had been received, the preferred supplier’s pack price ÷ pack
        size; otherwise the cost is unknown and the line is left out of the margin (never counted at nothing). Margin %
        is the margin as a share of those sales.
      </p>
      {rows.length === 0 ? (
        <p>Nothing sold this month.</p>
      ) : (
        <table className={`w-full ${CARD_TABLE}`} data-testid="margins">
          <thead>
            <tr>
              <th scope="col">Category</th>
              <th scope="col">Sold</th>
              <th scope="col">Cost</th>
              <th scope="col">Margin</th>
              <th scope="col">Margin %</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.category} className={r.category === 'all' ? 'font-bold' : undefined} data-category={r.category}>
                <td data-label="Category">
                  {r.category === 'all' ? 'All categories' : CATEGORY_WORDS[r.category]}
                  {r.unknownLines ? (
                    <span className="block text-xs font-normal" data-testid="cost-unknown">
                      {`Cost unknown for ${r.unknownLines} line${r.unknownLines === 1 ? '' : 's'} (${m(r.unknownSoldMinor)} sold)`}
                    </span>
                  ) : null}
                  {r.offerLines ? (
                    <span className="muted block text-xs font-normal">
                      {`${r.offerLines} line${r.offerLines === 1 ? '' : 's'} costed at the supplier’s offer`}
                    </span>
                  ) : null}
                </td>
                <td data-label="Sold" className="tabular-nums" data-minor={r.soldMinor}>
                  {m(r.soldMinor)}
                </td>
                <td data-label="Cost" className="tabular-nums" data-minor={r.knownLines ? r.costMinor : undefined}>
                  {r.knownLines ? m(r.costMinor) : 'unknown'}
                </td>
                <td data-label="Margin" className="tabular-nums" data-minor={r.marginMinor ?? undefined}>
                  {r.marginMinor === null ? 'unknown' : m(r.marginMinor)}
                </td>
                <td data-label="Margin %" className="tabular-nums">
                  {r.marginPct === null ? '—' : `${r.marginPct.toFixed(1)} %`}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
