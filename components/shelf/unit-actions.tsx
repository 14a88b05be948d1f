'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { UnitState } from '@/lib/domain';
import { api, ApiError } from './api';

type Target = 'in_repair' | 'on_shelf' | 'retired';
const ACTIONS: Record<UnitState, { to: Target; label: string; danger?: boolean }[]> = {
  on_shelf: [
    { to: 'in_repair', label: 'To repair' },
    { to: 'retired', label: 'Retire', danger: true },
  ],
  in_repair: [
    { to: 'on_shelf', label: 'Back on shelf' },
    { to: 'retired', label: 'Retire', danger: true },
  ],
  out: [],
  held: [],
  retired: [],
};
const PROMPT: Record<Target, string> = {
  in_repair: 'What is wrong with it?',
  on_shelf: 'What was fixed?',
  retired: 'Why is it retired?',
};

/** State changes for one unit, each asking for its reason first. */
export function UnitActions({ unitId, state, code }: { unitId: string; state: UnitState; code: string }) {
  const router = useRouter();
  const [target, setTarget] = useState<Target | null>(null);
  const [reason, setReason] = useState('');
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  const actions = ACTIONS[state];
  if (!actions.length) return null;

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (!target) return;
    setBusy(true);
    setError('');
    try {
      await api(`/api/stock/units/${unitId}`, { method: 'PATCH', body: { state: target, reason } });
      setTarget(null);
      setReason('');
      router.refresh();
    } catch (err) {
      setError(
        err instanceof ApiError
          ? (err.fields.reason?.join('; ') ?? err.message)
          : 'Could not reach the server.',
      );
    } finally {
      setBusy(false);
    }
  }

  if (!target) {
    return (
      <div className="flex flex-wrap gap-1">
        {actions.map((a) => (
          <button
            key={a.to}
            type="button"
            className={a.danger ? 'btn-quiet text-red-800 dark:text-red-300' : 'btn-quiet'}
            onClick={() => setTarget(a.to)}
          >
            {a.label}
          </button>
        ))}
      </div>
    );
  }
  const id = `reason-${code}`;
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2">
      <div>
        <label htmlFor={id} className="label">
          {PROMPT[target]}
        </label>
        <input
          id={id}
          className="field"
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          autoFocus
          aria-invalid={error ? true : undefined}
        />
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>
        Confirm
      </button>
      <button type="button" className="btn-quiet" onClick={() => setTarget(null)}>
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
