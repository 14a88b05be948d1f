import Link from 'next/link';
import { formatDateTime } from '@/lib/format';
import type { LoanRow } from '@/lib/loans/queries';
import { StatePill } from '@/components/ui/state-pill';
import { VerdictBadge } from '@/components/ui/verdict-badge';

// A list of loans that reads well on a phone: what, whose (for stewards), due or returned, state.
export function LoanList({
  loans,
  timeZone,
  showBorrower,
  empty,
}: {
  loans: LoanRow[];
  timeZone: string;
  showBorrower: boolean;
  empty: string;
}) {
  if (!loans.length) return <p className="muted">{empty}</p>;
  return (
    <ul className="divide-y divide-stone-200 rounded-xl border border-stone-200 bg-white dark:divide-stone-800 dark:border-stone-800 dark:bg-stone-900">
      {loans.map((l) => (
        <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
          <span className="min-w-0">
            <Link href={`/loans/${l.id}`} className="font-semibold">
              {l.title}
            </Link>
            <span className="muted block text-sm">
              {showBorrower ? `${l.borrowerName} · ` : ''}
              {l.status === 'out'
                ? `due ${formatDateTime(l.dueAt, timeZone)}`
                : l.status === 'waiting'
                  ? 'for a steward to hand over'
                  : l.status === 'back_unchecked'
                    ? 'for a steward to check'
                    : l.status === 'cancelled'
                      ? 'given up before it was lent'
                      : `returned ${l.returnedAt ? formatDateTime(l.returnedAt, timeZone) : ''}`}
              {l.overridden ? ' · check overridden' : ''}
            </span>
          </span>
          <span className="flex items-center gap-2">
            {l.verdict ? <VerdictBadge verdict={l.verdict} /> : null}
            <StatePill state={l.overdue ? 'overdue' : l.status} />
          </span>
        </li>
      ))}
    </ul>
  );
}
