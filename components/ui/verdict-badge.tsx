import { CircleCheck, TriangleAlert, OctagonX } from 'lucide-react';
import { clsx } from 'clsx';

export type VerdictWord = 'ok' | 'caution' | 'fail';

const LOOK: Record<VerdictWord, { label: string; Icon: typeof CircleCheck; cls: string }> = {
  ok: { label: 'OK', Icon: CircleCheck, cls: 'bg-green-100 text-green-900 border-green-700 dark:bg-green-950 dark:text-green-200' },
  caution: { label: 'Caution', Icon: TriangleAlert, cls: 'bg-amber-100 text-amber-950 border-amber-700 dark:bg-amber-950 dark:text-amber-200' },
  fail: { label: 'Fail', Icon: OctagonX, cls: 'bg-red-100 text-red-900 border-red-700 dark:bg-red-950 dark:text-red-200' },
};

/** A verdict always shows a word and an icon besides its colour. */
export function VerdictBadge({ verdict, large = false }: { verdict: VerdictWord; large?: boolean }) {
  const { label, Icon, cls } = LOOK[verdict];
  return (
    <span
      className={clsx(
        'inline-flex items-center gap-1.5 rounded-full border font-bold',
        large ? 'px-4 py-1.5 text-lg' : 'px-2.5 py-0.5 text-sm',
        cls,
      )}
      data-verdict={verdict}
    >
      <Icon aria-hidden className={large ? 'size-5' : 'size-4'} />
      {label}
    </span>
  );
}
