'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { InlineError } from '@/components/people/form-field';
import { callApi, errorText, type ApiError } from '@/components/loans/api';
import { formatDateTime } from '@/lib/format';
import type { Resolution } from '@/lib/reconcile/resolutions';

/**
 * The treasurer's note on a row that does not match: shown with who wrote it and when, and written or
 * changed in place. Saved through POST /api/books/resolutions (one transaction with its audit line).
 */
export function ResolveRow({
  month,
  rowKey,
  resolution,
  timeZone,
}: {
  month: string;
  rowKey: string;
  resolution: Resolution | null;
  timeZone: string;
}) {
  const router = useRouter();
  const id = useId();
  const [note, setNote] = useState(resolution?.note ?? '');
  const save = useMutation({
    mutationFn: () => callApi('/api/books/resolutions', 'POST', { month, rowKey, note }),
    onSuccess: () => router.refresh(),
  });
  const fieldError = (save.error as ApiError | null)?.fields?.note?.[0];
  return (
    <div className="min-w-48 space-y-1 text-sm" data-resolution={resolution ? 'resolved' : 'open'}>
      {resolution ? (
        <p>
          <span className="font-semibold">Explained:</span> {resolution.note}{' '}
          <span className="muted text-xs">
            ({resolution.writtenBy ?? 'someone no longer here'},{' '}
            {formatDateTime(resolution.writtenAt, timeZone)})
          </span>
        </p>
      ) : (
        <p className="font-semibold text-amber-900 dark:text-amber-200">Not explained yet</p>
      )}
      <details>
        <summary className="cursor-pointer">{resolution ? 'Change the note' : 'Explain this row'}</summary>
        <form
          className="mt-1 space-y-1"
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate();
          }}
        >
          <label htmlFor={`${id}-note`} className="label">
            What you found or did
          </label>
          <textarea
            id={`${id}-note`}
            className="field min-h-20"
            maxLength={2000}
            value={note}
            aria-invalid={fieldError ? true : undefined}
            onChange={(e) => setNote(e.target.value)}
          />
          <button type="submit" className="btn-quiet" disabled={save.isPending || !note.trim()}>
            {save.isPending ? 'Saving…' : 'Save the note'}
          </button>
          {save.isError ? <InlineError alert>{fieldError ?? errorText(save.error)}</InlineError> : null}
        </form>
      </details>
    </div>
  );
}
