'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { callApi } from './api';
import { ErrorNote } from './error-note';
import { displayCode } from '@/labels/code';
import { parseMoney } from '@/lib/money';

type Line = { id: string; name: string; qty: number; unitCode: string | null };
type Condition = 'ok' | 'missing' | 'damaged';

// Checking a loan back in at the bench: each line back in good order, or some of it missing or damaged.
// A steward may charge the borrower for a line missing or damaged (taken from the deposit first).
export function ReturnForm({
  loanId,
  lines,
  canCharge = false,
  currency,
}: {
  loanId: string;
  lines: Line[];
  canCharge?: boolean;
  currency: string;
}) {
  const router = useRouter();
  const ids = useId();
  const [state, setState] = useState<Record<string, { condition: Condition; back: number }>>(
    Object.fromEntries(lines.map((l) => [l.id, { condition: 'ok', back: l.qty }])),
  );
  const [note, setNote] = useState('');
  const [charge, setCharge] = useState<Record<string, { amount: string; note: string }>>({});
  const setChargeOf = (id: string, patch: Partial<{ amount: string; note: string }>) =>
    setCharge((c) => ({ ...c, [id]: { ...(c[id] ?? { amount: '', note: '' }), ...patch } }));
  /** A typed amount in minor units; one that does not parse is sent as typed, so the server names the field. */
  const chargeOf = (id: string) => {
    const c = charge[id];
    if (!canCharge || !c || !c.amount.trim() || state[id].condition === 'ok') return {};
    const minor = parseMoney(c.amount, currency);
    return { chargeMinor: minor ?? c.amount, ...(c.note.trim() ? { chargeNote: c.note.trim() } : {}) };
  };
  const set = (id: string, patch: Partial<{ condition: Condition; back: number }>) =>
    setState((s) => ({ ...s, [id]: { ...s[id], ...patch } }));
  const m = useMutation({
    mutationFn: () =>
      callApi<{ return: { status: string } }>(`/api/loans/${loanId}/return`, 'POST', {
        lines: lines.map((l) => {
          const s = state[l.id];
          return {
            lineId: l.id,
            condition: s.condition,
            returnedQty: s.condition === 'ok' ? l.qty : Math.min(s.back, l.qty - 1),
            ...chargeOf(l.id),
          };
        }),
        ...(note.trim() ? { note: note.trim() } : {}),
      }),
    onSuccess: () => router.refresh(),
  });
  return (
    <form
      aria-labelledby={`${ids}-h`}
      className="card space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate();
      }}
    >
      <h2 id={`${ids}-h`} className="text-lg font-bold">
        Check it back in
      </h2>
      <p className="muted text-sm">
        Count each line. Anything missing or damaged is recorded and taken off the shelf.
        {canCharge ? ' A charge is taken from the deposit first; the rest of the deposit goes back to the card.' : ''}
      </p>
      <ul className="divide-y divide-stone-200 dark:divide-stone-800">
        {lines.map((l) => {
          const s = state[l.id];
          return (
            <li key={l.id} className="space-y-2 py-2">
              <p className="font-semibold">
                {l.qty > 1 ? `${l.qty} × ` : ''}
                {l.name}
                {l.unitCode ? <span className="muted text-sm font-normal"> · label {displayCode(l.unitCode)}</span> : null}
              </p>
              <div className="flex flex-wrap items-end gap-3">
                <div>
                  <label className="label" htmlFor={`${ids}-c-${l.id}`}>
                    Condition
                  </label>
                  <select
                    id={`${ids}-c-${l.id}`}
                    className="field"
                    value={s.condition}
                    onChange={(e) =>
                      set(l.id, {
                        condition: e.target.value as Condition,
                        back: e.target.value === 'ok' ? l.qty : l.qty - 1,
                      })
                    }
                  >
                    <option value="ok">All back, fine</option>
                    <option value="missing">Missing</option>
                    <option value="damaged">Damaged</option>
                  </select>
                </div>
                {s.condition !== 'ok' && l.qty > 1 ? (
                  <div>
                    <label className="label" htmlFor={`${ids}-q-${l.id}`}>
                      Back in good order
                    </label>
                    <input
                      id={`${ids}-q-${l.id}`}
                      className="field w-28"
                      type="number"
                      min={0}
                      max={l.qty - 1}
                      value={s.back}
                      onChange={(e) =>
                        set(l.id, { back: Math.max(0, Math.min(l.qty - 1, Number(e.target.value))) })
                      }
                    />
                  </div>
                ) : null}
              </div>
              {canCharge && s.condition !== 'ok' ? (
                <div className="flex flex-wrap items-end gap-3">
                  <div>
                    <label className="label" htmlFor={`${ids}-m-${l.id}`}>
                      Charge the borrower ({currency})
                    </label>
                    <input
                      id={`${ids}-m-${l.id}`}
                      className="field w-32"
                      inputMode="decimal"
                      placeholder="none"
                      value={charge[l.id]?.amount ?? ''}
                      onChange={(e) => setChargeOf(l.id, { amount: e.target.value })}
                    />
                  </div>
                  <div className="min-w-0 flex-1">
                    <label className="label" htmlFor={`${ids}-n-${l.id}`}>
                      Why (the borrower reads it)
                    </label>
                    <input
                      id={`${ids}-n-${l.id}`}
                      className="field"
                      maxLength={2000}
                      value={charge[l.id]?.note ?? ''}
                      onChange={(e) => setChargeOf(l.id, { note: e.target.value })}
                    />
                  </div>
                </div>
              ) : null}
            </li>
          );
        })}
      </ul>
      <div>
        <label className="label" htmlFor={`${ids}-note`}>
          Note (what is missing or damaged, what needs fixing)
        </label>
        <textarea
          id={`${ids}-note`}
          className="field"
          rows={2}
          maxLength={1000}
          value={note}
          onChange={(e) => setNote(e.target.value)}
        />
      </div>
      <button type="submit" className="btn-primary w-full" disabled={m.isPending}>
        {m.isPending ? 'Recording…' : 'Confirm the return'}
      </button>
      <ErrorNote error={m.error} />
    </form>
  );
}
