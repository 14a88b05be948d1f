import { CircleCheck, CircleHelp, Scale, TriangleAlert } from 'lucide-react';
import { clsx } from 'clsx';
import type { ReconStatus } from '@/lib/reconcile/match';

// A reconciliation state always shows a word and an icon besides its colour.
const LOOK: Record<ReconStatus, { word: string; Icon: typeof CircleCheck; cls: string }> = {
  matched: { word: 'matched', Icon: CircleCheck, cls: 'border-green-700 text-green-900 dark:text-green-200' },
  amount_differs: {
    word: 'amounts differ',
    Icon: Scale,
    cls: 'border-red-700 text-red-900 dark:text-red-200',
  },
  ours_only: {
    word: 'only in our books',
    Icon: TriangleAlert,
    cls: 'border-amber-700 text-amber-950 dark:text-amber-200',
  },
  theirs_only: {
    word: 'only at the processor',
    Icon: CircleHelp,
    cls: 'border-amber-700 text-amber-950 dark:text-amber-200',
  },
};

export const reconWord = (s: ReconStatus) => LOOK[s].word;

export function ReconStatusBadge({ status }: { status: ReconStatus }) {
  const { word, Icon, cls } = LOOK[status];
  return (
    <span
      className={clsx(
        'inline-flex items-center gap-1 rounded-md border px-1.5 py-0.5 text-xs font-semibold whitespace-nowrap',
        cls,
      )}
      data-recon-status={status}
    >
      <Icon aria-hidden className="size-3.5" />
      {word}
    </span>
  );
}
