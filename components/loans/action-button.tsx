'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { callApi } from './api';
import { ErrorNote } from './error-note';

// A button that makes one API call (renew, hold, cancel a hold, refill a box) and refreshes the page.
export function ActionButton({
  url,
  method = 'POST',
  body,
  label,
  busyLabel,
  done,
  variant = 'quiet',
  confirm,
}: {
  url: string;
  method?: 'POST' | 'DELETE' | 'PUT';
  body?: unknown;
  label: string;
  busyLabel?: string;
  done?: string;
  variant?: 'primary' | 'quiet' | 'danger';
  confirm?: string;
}) {
  const router = useRouter();
  const m = useMutation({
    mutationFn: () => callApi(url, method, body),
    onSuccess: () => router.refresh(),
  });
  return (
    <div className="space-y-1">
      <button
        type="button"
        className={variant === 'primary' ? 'btn-primary' : variant === 'danger' ? 'btn-danger' : 'btn-quiet'}
        disabled={m.isPending}
        onClick={() => {
          if (confirm && !window.confirm(confirm)) return;
          m.mutate();
        }}
      >
        {m.isPending ? (busyLabel ?? 'Working…') : label}
      </button>
      <ErrorNote error={m.error} small />
      {m.isSuccess && done ? (
        <p role="status" className="text-sm">
          {done}
        </p>
      ) : null}
    </div>
  );
}
