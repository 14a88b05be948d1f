'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { errorText, sendJson } from '@/components/people/send-json';

/** Withdraws one sign-off after a confirmation; the record stays, marked withdrawn. */
export function WithdrawSignoff({ id, what }: { id: string; what: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div>
      <button
        type="button"
        className="btn-quiet"
        disabled={busy}
        aria-label={`Withdraw the sign-off ${what}`}
        onClick={async () => {
          if (!window.confirm(`Withdraw the sign-off “${what}”?`)) return;
          setBusy(true);
          setError(null);
          try {
            await sendJson(`/api/signoffs/${id}`, 'DELETE');
            router.refresh();
          } catch (e) {
            setError(errorText(e));
          } finally {
            setBusy(false);
          }
        }}
      >
        Withdraw
      </button>
      {error ? (
        <p role="alert" className="text-sm text-red-800 dark:text-red-300">
          {error}
        </p>
      ) : null}
    </div>
  );
}
