import { clsx } from 'clsx';

// Words of our own for unit and loan states; the colour only repeats what the word says.
const WORDS: Record<string, string> = {
  on_shelf: 'on shelf',
  out: 'out',
  held: 'held',
  in_repair: 'in repair',
  retired: 'retired',
  overdue: 'overdue',
  returned: 'returned',
  returned_short: 'returned short',
  waiting: 'waiting at the bench',
  back_unchecked: 'back, not yet checked',
  deposit_due: 'waiting for the deposit',
  cancelled: 'given up',
  pending: 'pending',
  paid: 'paid',
  failed: 'failed',
  expired: 'expired',
  refunded: 'refunded',
  partially_refunded: 'part refunded',
  reversed: 'reversed',
};
const TONE: Record<string, string> = {
  on_shelf: 'border-green-700 text-green-900 dark:text-green-200',
  paid: 'border-green-700 text-green-900 dark:text-green-200',
  returned: 'border-stone-500 text-stone-700 dark:text-stone-300',
  overdue: 'border-red-700 text-red-900 dark:text-red-200',
  failed: 'border-red-700 text-red-900 dark:text-red-200',
  in_repair: 'border-amber-700 text-amber-950 dark:text-amber-200',
  returned_short: 'border-amber-700 text-amber-950 dark:text-amber-200',
  waiting: 'border-sky-700 text-sky-900 dark:text-sky-200',
  deposit_due: 'border-sky-700 text-sky-900 dark:text-sky-200',
  back_unchecked: 'border-amber-700 text-amber-950 dark:text-amber-200',
};

export function StatePill({ state }: { state: string }) {
  return (
    <span
      className={clsx(
        'inline-block rounded-md border px-2 py-0.5 text-xs font-semibold whitespace-nowrap',
        TONE[state] ?? 'border-stone-400 text-stone-800 dark:text-stone-200',
      )}
    >
      {WORDS[state] ?? state.replaceAll('_', ' ')}
    </span>
  );
}
