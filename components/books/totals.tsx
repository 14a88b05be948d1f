import type { ReconTotals } from '@/lib/reconcile/match';
import { formatMoney } from '@/lib/money';
import { reconWord } from './recon-status';
import { Figure } from './figure';

/** The month's figures side by side, in our words: card money through the processor, our own books. */
export function Totals({
  totals,
  currency,
  unresolved,
}: {
  totals: ReconTotals;
  currency: string;
  unresolved: number;
}) {
  const m = (n: number) => formatMoney(n, currency);
  const p = totals.processor;
  const o = totals.ours;
  const item = (label: string, value: string, testId?: string) => (
    <Figure key={label} label={label} value={value} testId={testId} />
  );
  return (
    <div className="grid gap-3 lg:grid-cols-3">
      <section aria-labelledby="totals-processor">
        <h3 id="totals-processor" className="mb-1 font-semibold">
          Card money, as the processor holds it
        </h3>
        <dl className="grid grid-cols-2 gap-2">
          {item('Taken by card', m(p.grossMinor), 'gross')}
          {item('Kept as fees', m(p.feesMinor), 'fees')}
          {item('Given back', m(p.refundsMinor), 'refunds')}
          {item('Left for us', m(p.netMinor), 'net')}
          {item('Sent to our bank', m(p.paidOutMinor), 'paid-out')}
        </dl>
      </section>
      <section aria-labelledby="totals-ours">
        <h3 id="totals-ours" className="mb-1 font-semibold">
          In our books
        </h3>
        <dl className="grid grid-cols-2 gap-2">
          {item('Card sales', m(o.cardMinor))}
          {item('Card refunds', m(o.cardRefundsMinor))}
          {item('Cash (honour box)', m(o.cashMinor))}
          {item('Cash refunds', m(o.cashRefundsMinor))}
          {item('Deposits taken', m(o.depositsMinor), 'deposits-taken')}
          {item('Deposits given back', m(o.depositReleasesMinor), 'deposits-released')}
          {item('Charges', m(o.chargesMinor), 'charges')}
          {item('Charges kept from deposits', m(o.chargesFromDepositsMinor), 'charges-from-deposits')}
        </dl>
      </section>
      <section aria-labelledby="totals-match">
        <h3 id="totals-match" className="mb-1 font-semibold">
          Do they agree?
        </h3>
        <dl className="grid grid-cols-2 gap-2">
          {(['matched', 'amount_differs', 'ours_only', 'theirs_only'] as const).map((s) =>
            item(reconWord(s), String(totals.counts[s]), `count-${s}`),
          )}
          {item('Not explained yet', String(unresolved), 'count-unresolved')}
        </dl>
      </section>
    </div>
  );
}
