import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatMoney } from '@/lib/money';
import type { PartCategory } from '@/lib/domain';

/** Money out (restocking received at the price paid) beside money in (sales less refunds), per category. */
export function SpendBesideSales({
  rows,
  currency,
  label,
  month,
}: {
  rows: { category: PartCategory; soldMinor: number; spentMinor: number }[];
  currency: string;
  label: string;
  month: string;
}) {
  const money = (n: number) => formatMoney(n, currency);
  const sold = rows.reduce((n, r) => n + r.soldMinor, 0);
  const spent = rows.reduce((n, r) => n + r.spentMinor, 0);
  return (
    <section aria-labelledby="spend" className="card space-y-3">
      <h2 id="spend" className="text-lg font-bold">
        Restocking beside sales, {label}
      </h2>
      <p className="muted text-sm">
        Spent: what arrived against order lists this month, at the price paid. Sold: sales paid this month, less what was refunded.
      </p>
      {rows.length === 0 ? (
        <p>Nothing bought or sold this month.</p>
      ) : (
        <ul className="divide-y divide-stone-200 text-sm dark:divide-stone-800" data-testid="spend-rows">
          {rows.map((r) => (
            <li key={r.category} className="flex flex-wrap justify-between gap-x-3 py-1.5">
              <span className="font-semibold">{CATEGORY_WORDS[r.category]}</span>
              <span>
                sold {money(r.soldMinor)} · spent {money(r.spentMinor)}
              </span>
            </li>
          ))}
          <li className="flex flex-wrap justify-between gap-x-3 py-1.5 font-bold">
            <span>All categories</span>
            <span data-testid="spend-total" data-minor={spent}>
              sold {money(sold)} · spent {money(spent)}
            </span>
          </li>
        </ul>
      )}
      <a href={`/api/books/spend?month=${month}`} className="btn-quiet" download>
        Spend as CSV
      </a>
    </section>
  );
}
