import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import type { ToInvestigate as Item } from '@/lib/reconcile/investigate';
import { SaleRef } from './sale-ref';

/**
 * Payments the processor reported that Ohmstead refused to count: a checkout session it did not open
 * for the sale, or money other than the sale's exact amount and currency. Nothing changed because of
 * them; the processor may hold the money, so each wants a look (and a refund there if it is not ours).
 */
export function ToInvestigate({ items, timeZone }: { items: Item[]; timeZone: string }) {
  if (!items.length) return null;
  return (
    <div data-testid="to-investigate" className="space-y-2">
      <h3 className="font-semibold">To investigate ({items.length})</h3>
      <p className="muted text-sm">
        The processor reported these payments, but they were not the payment Ohmstead asked for, so no sale
        was marked paid and nothing left the shelf.
      </p>
      <ul className="divide-y divide-stone-200 text-sm dark:divide-stone-800">
        {items.map((i) => (
          <li key={`${i.at}-${i.objectId}-${i.saleId}`} className="space-y-0.5 py-2 break-words">
            <p>
              {formatDateTime(i.at, timeZone)} · sale <SaleRef id={i.saleId} />
              {i.amountMinor !== null && i.currency ? ` · ${formatMoney(i.amountMinor, i.currency)}` : ''}
            </p>
            <p>{i.why}</p>
            <p className="muted font-mono text-xs">
              {i.type}
              {i.objectId ? ` · ${i.objectId}` : ''}
            </p>
          </li>
        ))}
      </ul>
    </div>
  );
}
