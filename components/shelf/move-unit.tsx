'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from './api';

/** Puts one labelled unit in another bin; its state stays as it is. */
export function MoveUnit({
  unitId,
  code,
  locations,
  currentLocationId,
}: {
  unitId: string;
  code: string;
  locations: { id: string; name: string }[];
  currentLocationId: string | null;
}) {
  const router = useRouter();
  const choices = locations.filter((l) => l.id !== currentLocationId);
  const [open, setOpen] = useState(false);
  const [to, setTo] = useState(choices[0]?.id ?? '');
  const [error, setError] = useState('');
  if (!choices.length) return null;
  if (!open) {
    return (
      <button type="button" className="btn-quiet" onClick={() => setOpen(true)}>
        Move
      </button>
    );
  }
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError('');
    try {
      await api('/api/stock/move', { body: { unitId, toLocationId: to } });
      setOpen(false);
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'Could not reach the server.');
    }
  }
  const id = `move-${code}`;
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2">
      <div>
        <label htmlFor={id} className="label">
          Move to
        </label>
        <select id={id} className="field" value={to} onChange={(e) => setTo(e.target.value)}>
          {choices.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-primary">
        Move
      </button>
      <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
        Cancel
      </button>
      {error ? (
        <p role="alert" className="w-full text-sm font-semibold text-red-800 dark:text-red-300">
          {error}
        </p>
      ) : null}
    </form>
  );
}
