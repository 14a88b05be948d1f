'use client';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { pickBin } from '@/lib/inventory/find-bins';
import {
  formatQty,
  MEASURE_SYMBOL,
  qtyInputMode,
  qtyProblem,
  qtyStep,
  roundQty,
  type Measure,
} from '@/lib/inventory/measure';
import { api, ApiError } from './api';
import { FormMessage } from './form-bits';
import { PartPicker } from './part-picker';
import { ScrollRegion } from './scroll-region';
import { TableHead } from './table-head';

type Line = {
  partId: string;
  name: string;
  sku: string;
  expected: number;
  counted: number | null;
  /** Whole items, metres or grams: metres and grams take decimals. */
  measure: Measure;
  current: number;
  variance: number | null;
};
type Count = { id: string; status: string; locationId: string; locationName: string; lines: Line[] };
type Location = { id: string; name: string; code: string | null };

/** The count being worked on is in the address, so a reload or coming back resumes it. */
function rememberCount(id: string | null) {
  const url = new URL(window.location.href);
  if (id) url.searchParams.set('count', id);
  else url.searchParams.delete('count');
  window.history.replaceState(null, '', url);
}

/**
 * Count one bin: pick or scan it, type what is there (each figure is saved on the server as it is
 * typed, so leaving the page loses nothing), review the differences, post or abandon.
 */
export function CountMode({
  locations,
  openCounts: initialOpen,
  resumeId = null,
}: {
  locations: Location[];
  openCounts: { id: string; locationName: string }[];
  resumeId?: string | null;
}) {
  const queryClient = useQueryClient();
  const [countId, setCountIdState] = useState<string | null>(resumeId);
  const [openCounts, setOpenCounts] = useState(initialOpen);
  const [binText, setBinText] = useState('');
  const [candidates, setCandidates] = useState<Location[]>([]);
  const [draft, setDraft] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState<'idle' | 'saving' | 'saved' | 'failed'>('idle');
  const setCountId = (id: string | null) => {
    setCountIdState(id);
    rememberCount(id);
  };
  const forget = (id: string | null) => setOpenCounts((list) => list.filter((c) => c.id !== id));
  const [message, setMessage] = useState<{ text: string; ok?: boolean; fields?: Record<string, string[]> }>({
    text: '',
  });

  const count = useQuery({
    queryKey: ['count', countId],
    queryFn: () => api<Count>(`/api/stock/counts/${countId}`),
    enabled: Boolean(countId),
  });
  const fail = (e: unknown) =>
    setMessage(
      e instanceof ApiError ? { text: e.message, fields: e.fields } : { text: 'Could not reach the server.' },
    );

  const open = useMutation({
    mutationFn: (locationId: string) =>
      api<{ id: string; created: boolean }>('/api/stock/counts', { body: { locationId } }),
    onSuccess: (r, locationId) => {
      setCountId(r.id);
      setDraft({});
      setCandidates([]);
      const name = locations.find((l) => l.id === locationId)?.name ?? '';
      setOpenCounts((list) => (list.some((c) => c.id === r.id) ? list : [{ id: r.id, locationName: name }, ...list]));
      setMessage({
        text: r.created
          ? 'Count opened. Type what you find in the bin.'
          : 'This bin already had an open count; carrying on with it.',
        ok: true,
      });
    },
    onError: fail,
  });
  const lines = () =>
    (count.data?.lines ?? []).map((l) => {
      const typed = draft[l.partId];
      return {
        partId: l.partId,
        counted: typed === undefined ? l.counted : typed === '' ? null : Number(typed),
      };
    });
  // Saved as typed: a short pause after the last keystroke sends what changed.
  const autosave = useMutation({
    mutationFn: (typed: Record<string, string>) =>
      api<Count>(`/api/stock/counts/${countId}`, {
        method: 'PATCH',
        body: { lines: Object.entries(typed).map(([partId, v]) => ({ partId, counted: v === '' ? null : Number(v) })) },
      }),
    onMutate: () => setSaved('saving'),
    onSuccess: (c, typed) => {
      queryClient.setQueryData(['count', countId], c);
      // Keep only what was typed since this save left.
      setDraft((d) => Object.fromEntries(Object.entries(d).filter(([k, v]) => typed[k] !== v)));
      setSaved('saved');
    },
    onError: () => setSaved('failed'),
  });
  const pending = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => {
    // A figure that does not fit its part's unit (a fraction of whole items, more than three decimals of
    // metres or grams, below zero) waits on screen until it is corrected.
    const unitOf = new Map((count.data?.lines ?? []).map((l) => [l.partId, l.measure]));
    const valid = Object.fromEntries(
      Object.entries(draft).filter(
        ([partId, v]) =>
          v === '' || (Number(v) >= 0 && qtyProblem(Number(v), unitOf.get(partId) ?? 'each') === null),
      ),
    );
    if (!countId || !Object.keys(valid).length) return;
    if (pending.current) clearTimeout(pending.current);
    pending.current = setTimeout(() => autosave.mutate(valid), 600);
    return () => {
      if (pending.current) clearTimeout(pending.current);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- autosave is stable enough; re-run on typing only
  }, [draft, countId]);

  const save = useMutation({
    mutationFn: (extra: { partId: string; counted: number | null }[] = []) =>
      api<Count>(`/api/stock/counts/${countId}`, {
        method: 'PATCH',
        body: { lines: [...lines(), ...extra] },
      }),
    onSuccess: (c) => {
      queryClient.setQueryData(['count', countId], c);
      setDraft({});
      setMessage({ text: 'Counts saved. Review the differences, then post.', ok: true });
    },
    onError: fail,
  });
  const post = useMutation({
    mutationFn: async () => {
      await api(`/api/stock/counts/${countId}`, { method: 'PATCH', body: { lines: lines() } });
      return api<{ changed: number }>(`/api/stock/counts/${countId}/post`, { method: 'POST' });
    },
    onSuccess: (r) => {
      setMessage({
        text: `Posted. ${r.changed} quantit${r.changed === 1 ? 'y' : 'ies'} changed to match the count.`,
        ok: true,
      });
      forget(countId);
      setCountId(null);
    },
    onError: fail,
  });
  const abandon = useMutation({
    mutationFn: () => api(`/api/stock/counts/${countId}`, { method: 'DELETE' }),
    onSuccess: () => {
      forget(countId);
      setCountId(null);
      setDraft({});
      setMessage({ text: 'Count abandoned; no stock changed.', ok: true });
    },
    onError: fail,
  });

  function openByText(e: React.FormEvent) {
    e.preventDefault();
    const { bin, candidates: found } = pickBin(locations, binText);
    setCandidates(bin ? [] : found);
    if (bin) return open.mutate(bin.id);
    setMessage(
      found.length
        ? { text: `${found.length} bins match “${binText.trim()}”; choose one.` }
        : { text: `No bin here has “${binText.trim()}” in its name or code.` },
    );
  }

  if (!countId || !count.data) {
    return (
      <div className="space-y-4">
        <FormMessage message={message.text} fields={message.fields} ok={message.ok} />
        <form onSubmit={openByText} className="card flex flex-wrap items-end gap-3">
          <div className="min-w-64 flex-1">
            <label htmlFor="bin" className="label">
              Scan the bin, or type any part of its name or code
            </label>
            <input
              id="bin"
              className="field font-mono"
              value={binText}
              onChange={(e) => setBinText(e.target.value)}
              autoComplete="off"
              list="bin-names"
            />
            <datalist id="bin-names">
              {locations.map((l) => (
                <option key={l.id} value={l.name} />
              ))}
            </datalist>
          </div>
          <button type="submit" className="btn-primary" disabled={open.isPending}>
            Start counting
          </button>
        </form>
        {candidates.length ? (
          <section className="card" aria-labelledby="bin-choices">
            <h2 id="bin-choices" className="font-bold">
              Which bin?
            </h2>
            <ul className="mt-2 flex flex-wrap gap-2">
              {candidates.map((l) => (
                <li key={l.id}>
                  <button type="button" className="btn-quiet" onClick={() => open.mutate(l.id)}>
                    Count {l.name}
                  </button>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        {openCounts.length ? (
          <section className="card" aria-labelledby="open-counts">
            <h2 id="open-counts" className="font-bold">
              Counts in progress
            </h2>
            <ul className="mt-2 flex flex-wrap gap-2">
              {openCounts.map((c) => (
                <li key={c.id}>
                  <button type="button" className="btn-quiet" onClick={() => setCountId(c.id)}>
                    {c.locationName}
                  </button>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
      </div>
    );
  }

  const c = count.data;
  const differences = c.lines.filter((l) => {
    const typed = draft[l.partId];
    const counted = typed === undefined ? l.counted : typed === '' ? null : Number(typed);
    return counted !== null && roundQty(counted - l.current) !== 0;
  }).length;

  return (
    <div className="space-y-4">
      <FormMessage message={message.text} fields={message.fields} ok={message.ok} />
      <section className="card" aria-labelledby="count-title">
        <h2 id="count-title" className="text-lg font-bold">
          Counting {c.locationName}
        </h2>
        <p className="muted text-sm">
          “Recorded” is what Ohmstead holds for this bin now; leave a line blank to skip it. Each figure is kept
          as you type, until you post or abandon the count.
        </p>
        <p role="status" className="muted text-sm">
          {saved === 'saving' ? 'Saving…' : saved === 'saved' ? 'Saved' : saved === 'failed' ? 'Not saved yet: check the figures.' : ''}
        </p>
        <div className="mt-3">
          <ScrollRegion label="Count lines">
            <table className="table-dense">
              <TableHead columns={['Part', 'Recorded', 'Counted', 'Difference']} />
              <tbody>
                {c.lines.map((l, i) => {
                  const typed = draft[l.partId];
                  const value = typed ?? (l.counted === null ? '' : String(l.counted));
                  const diff =
                    value === '' || Number.isNaN(Number(value)) ? null : roundQty(Number(value) - l.current);
                  const symbol = MEASURE_SYMBOL[l.measure];
                  return (
                    <tr key={l.partId}>
                      <td>
                        {l.name} <span className="muted font-mono text-xs">{l.sku}</span>
                      </td>
                      <td className="tabular-nums">{formatQty(l.current, l.measure)}</td>
                      <td>
                        <label className="sr-only" htmlFor={`count-${i}`}>
                          Counted {l.name}
                          {l.measure === 'metre' ? ', in metres' : l.measure === 'gram' ? ', in grams' : ''}
                        </label>
                        <span className="inline-flex items-center gap-1">
                          <input
                            id={`count-${i}`}
                            type="number"
                            min={0}
                            step={qtyStep(l.measure)}
                            inputMode={qtyInputMode(l.measure)}
                            className="field w-28"
                            value={value}
                            aria-invalid={message.fields?.[`lines.${i}.counted`] ? true : undefined}
                            onChange={(e) => setDraft((d) => ({ ...d, [l.partId]: e.target.value }))}
                          />
                          {symbol ? <span aria-hidden>{symbol}</span> : null}
                        </span>
                      </td>
                      <td
                        className={
                          diff ? 'font-bold text-amber-900 tabular-nums dark:text-amber-200' : 'tabular-nums'
                        }
                      >
                        {diff === null ? '—' : `${diff > 0 ? '+' : ''}${formatQty(diff, l.measure)}`}
                      </td>
                    </tr>
                  );
                })}
                {c.lines.length === 0 ? (
                  <tr>
                    <td colSpan={4} className="muted">
                      The records show nothing counted in this bin. Add what you find below.
                    </td>
                  </tr>
                ) : null}
              </tbody>
            </table>
          </ScrollRegion>
        </div>
        <div className="mt-4">
          <p className="label">Found something not on the list?</p>
          <PartPicker
            id="found-part"
            value={null}
            onChange={(p) => p && save.mutate([{ partId: p.id, counted: null }])}
          />
        </div>
      </section>
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className="btn-quiet" onClick={() => save.mutate([])} disabled={save.isPending}>
          Save counts
        </button>
        <button type="button" className="btn-primary" onClick={() => post.mutate()} disabled={post.isPending}>
          Post count ({differences} difference{differences === 1 ? '' : 's'})
        </button>
        <button
          type="button"
          className="btn-quiet"
          onClick={() => abandon.mutate()}
          disabled={abandon.isPending}
        >
          Abandon
        </button>
      </div>
    </div>
  );
}
