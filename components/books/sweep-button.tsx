'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { InlineError } from '@/components/people/form-field';
import { callApi, errorText } from '@/components/loans/api';

type Sweep = { sweep: { checked: number; paid: number; expired: number; failed: number; refused: number } };

/** Asks the processor about the card sales left waiting past their expiry (POST /api/books/sweep). */
export function SweepButton({ waiting }: { waiting: number }) {
  const router = useRouter();
  const sweep = useMutation({
    mutationFn: () => callApi<Sweep>('/api/books/sweep', 'POST'),
    onSuccess: () => router.refresh(),
  });
  const s = sweep.data?.sweep;
  return (
    <div className="card space-y-2 text-sm">
      <p>
        {waiting} card {waiting === 1 ? 'sale is' : 'sales are'} still waiting for the processor past
        {waiting === 1 ? ' its' : ' their'} expiry.
      </p>
      <button type="button" className="btn-quiet" disabled={sweep.isPending} onClick={() => sweep.mutate()}>
        {sweep.isPending ? 'Asking the processor…' : 'Check them with the processor now'}
      </button>
      {s ? (
        <p role="status">
          Checked {s.checked}: {s.paid} paid, {s.expired} expired, {s.failed} failed
          {s.refused ? `, ${s.refused} refused (see below)` : ''}.
        </p>
      ) : null}
      {sweep.isError ? <InlineError alert>{errorText(sweep.error)}</InlineError> : null}
    </div>
  );
}
