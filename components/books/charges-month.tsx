import { formatMoney } from '@/lib/money';
import type { ChargeMonth } from '@/lib/charges/month';
import { Figure } from './figure';

// The month's charges and deposits for the treasurer, in our words: what members were charged (and for
// what), what they paid by card and in cash, and what deposits were held, given back and kept.

export function ChargesMonth({ month, currency, label }: { month: ChargeMonth; currency: string; label: string }) {
  const m = (x: number) => formatMoney(x, currency);
  return (
    <section aria-labelledby="charges-month" className="card space-y-3">
      <h2 id="charges-month" className="text-lg font-bold">
        Charges and deposits in {label}
      </h2>
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Figure label="Charges raised" value={m(month.raisedMinor)} testId="charges-raised" />
        <Figure label="Paid by card" value={m(month.paidByCardMinor)} testId="charges-paid-card" />
        <Figure label="Paid in cash" value={m(month.paidInCashMinor)} testId="charges-paid-cash" />
        <Figure label="Deposits held" value={m(month.depositsHeldMinor)} testId="deposits-held" />
        <Figure label="Deposits given back" value={m(month.depositsGivenBackMinor)} testId="deposits-given-back" />
        <Figure label="Deposits kept for charges" value={m(month.depositsKeptMinor)} testId="deposits-kept" />
      </dl>
      <p className="muted text-sm">
        Charged for missing parts {m(month.raisedByKind.missing)}, damaged parts {m(month.raisedByKind.damaged)}, late
        returns {m(month.raisedByKind.late)}.
        {month.releasePending
          ? ` ${month.releasePending} deposit${month.releasePending === 1 ? '' : 's'} still waiting to go back to the card (retried every few minutes).`
          : ''}
      </p>
    </section>
  );
}
