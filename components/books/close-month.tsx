'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { InlineError } from '@/components/people/form-field';
import { callApi, errorText } from '@/components/loans/api';

/** Closes an ended month; asks once more when the reconciliation still has rows that need a look. */
export function CloseMonth({ month, label, problems }: { month: string; label: string; problems: number }) {
  const router = useRouter();
  const [sure, setSure] = useState(problems === 0);
  const close = useMutation({
    mutationFn: () => callApi('/api/books/periods', 'POST', { month }),
    onSuccess: () => router.refresh(),
  });
  return (
    <div className="space-y-2">
      {problems > 0 ? (
        <label className="flex items-start gap-2 text-sm">
          <input
            type="checkbox"
            className="mt-1 size-4"
            checked={sure}
            onChange={(e) => setSure(e.target.checked)}
          />
          <span>
            {problems} {problems === 1 ? 'row still needs' : 'rows still need'} a look. Close {label} anyway
            (later changes go in as reversing entries).
          </span>
        </label>
      ) : null}
      <button
        type="button"
        className="btn-quiet"
        disabled={!sure || close.isPending}
        onClick={() => close.mutate()}
      >
        {close.isPending ? 'Closing…' : `Close ${label}`}
      </button>
      {close.isError ? <InlineError alert>{errorText(close.error)}</InlineError> : null}
    </div>
  );
}
