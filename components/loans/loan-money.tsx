import { formatMoney } from '@/lib/money';
import type { LoanMoney } from '@/lib/deposits/read';

// A loan's deposit and charges, in words: what was paid, what was kept for which part, what went back,
// and what is still owed.

const DEPOSIT_WORDS: Record<string, string> = {
  pending: 'not paid yet',
  held: 'paid; held until the return is checked',
  releasing: 'release pending: being given back to the card',
  released: 'settled',
  ended: 'not paid; the borrow was given up',
};

export function LoanMoneyCard({ deposit, charges, isMine }: LoanMoney & { isMine: boolean }) {
  if (!deposit && !charges.length) return null;
  const owed = charges.reduce((s, c) => s + c.amountMinor - c.fromDepositMinor - c.settledMinor, 0);
  const cur = deposit?.currency ?? charges[0]?.currency ?? 'USD';
  return (
    <section aria-labelledby="money-heading" className="card space-y-2">
      <h2 id="money-heading" className="text-lg font-bold">
        Deposit and charges
      </h2>
      {deposit ? (
        <p>
          Deposit {formatMoney(deposit.amountMinor, deposit.currency)}: {DEPOSIT_WORDS[deposit.status]}.
          {deposit.releasedMinor !== null && deposit.status !== 'ended' ? (
            <span className="block">
              Kept {formatMoney(deposit.keptMinor, deposit.currency)}; given back{' '}
              {formatMoney(deposit.releasedMinor, deposit.currency)}
              {deposit.status === 'releasing' ? ' (on its way to the card)' : ''}.
            </span>
          ) : null}
        </p>
      ) : null}
      {charges.length ? (
        <ul className="divide-y divide-stone-200 dark:divide-stone-800">
          {charges.map((c) => (
            <li key={c.id} className="py-1">
              <span className="font-semibold">
                {c.item}, {c.kind}: {formatMoney(c.amountMinor, c.currency)}
              </span>
              <span className="muted block text-sm">
                {c.fromDepositMinor ? `${formatMoney(c.fromDepositMinor, c.currency)} from the deposit` : 'not covered by a deposit'}
                {c.settledMinor ? ` · ${formatMoney(c.settledMinor, c.currency)} paid` : ''}
                {c.note ? ` · “${c.note}”` : ''}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
      {owed > 0 ? (
        <p className="font-semibold text-red-800 dark:text-red-300">
          Still owed: {formatMoney(owed, cur)}{isMine ? ' — pay it by card below, or in cash to a steward.' : '.'}
        </p>
      ) : null}
    </section>
  );
}
