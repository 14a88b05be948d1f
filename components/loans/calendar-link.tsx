'use client';
import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { callApi } from './api';
import { ErrorNote } from './error-note';

// My private calendar-feed address: shown on request, replaceable (which revokes the old address).
export function CalendarLink() {
  const ids = useId();
  const [url, setUrl] = useState<string | null>(null);
  // Reading the address writes nothing; the first time there is none yet, so one is made (a POST).
  const show = useMutation({
    mutationFn: async () => {
      const current = await callApi<{ url: string | null }>('/api/calendar/link', 'GET');
      return current.url ? current : callApi<{ url: string }>('/api/calendar/link', 'POST');
    },
    onSuccess: (d) => setUrl(d.url),
  });
  const rotate = useMutation({
    mutationFn: () => callApi<{ url: string }>('/api/calendar/link', 'POST'),
    onSuccess: (d) => setUrl(d.url),
  });
  const error = show.error ?? rotate.error;
  return (
    <div className="space-y-2">
      {url ? (
        <>
          <label className="label" htmlFor={`${ids}-url`}>
            Add this address to your calendar app (keep it to yourself)
          </label>
          <input
            id={`${ids}-url`}
            className="field font-mono text-sm"
            readOnly
            value={url}
            onFocus={(e) => e.currentTarget.select()}
          />
          <button
            type="button"
            className="btn-quiet"
            onClick={() => rotate.mutate()}
            disabled={rotate.isPending}
          >
            Make a new address (the old one stops working)
          </button>
        </>
      ) : (
        <button type="button" className="btn-quiet" onClick={() => show.mutate()} disabled={show.isPending}>
          Show my calendar address
        </button>
      )}
      <ErrorNote error={error} small />
    </div>
  );
}
