'use client';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import type { PartPage } from '@/lib/inventory/parts-list';
import { formatQty } from '@/lib/inventory/measure';
import { api } from './api';

export type PickedPart = {
  id: string;
  name: string;
  sku: string;
  tracking: 'counted' | 'unit';
  /** Whole items, metres or grams (missing: whole items). */
  saleUnit?: string;
};

/** Finds a part by name, SKU or scanned code (the server searches all three). */
export function PartPicker({
  id,
  value,
  onChange,
  error,
}: {
  id: string;
  value: PickedPart | null;
  onChange: (p: PickedPart | null) => void;
  error?: string;
}) {
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  useEffect(() => {
    const t = setTimeout(() => setQ(text.trim()), 200);
    return () => clearTimeout(t);
  }, [text]);
  const { data, isFetching } = useQuery({
    queryKey: ['part-pick', q],
    queryFn: () => api<PartPage>(`/api/parts?${new URLSearchParams({ q, pageSize: '8' })}`),
    enabled: q.length > 0 && !value,
  });

  if (value) {
    return (
      <div className="flex flex-wrap items-center gap-2">
        <span className="rounded-lg border border-stone-300 px-3 py-2 dark:border-stone-600" id={id}>
          <strong>{value.name}</strong> <span className="muted font-mono text-xs">{value.sku}</span>
        </span>
        <button type="button" className="btn-quiet" onClick={() => onChange(null)}>
          Change part
        </button>
      </div>
    );
  }
  return (
    <div>
      <input
        id={id}
        type="search"
        className="field"
        value={text}
        onChange={(e) => setText(e.target.value)}
        placeholder="Name, SKU, or scan its code"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        onKeyDown={(e) => {
          // A USB scanner ends with Enter: take the single match straight away.
          if (e.key === 'Enter') {
            e.preventDefault();
            if (data?.rows.length === 1) onChange(data.rows[0]);
          }
        }}
      />
      {q && data ? (
        <ul
          className="mt-1 divide-y divide-stone-200 rounded-lg border border-stone-200 dark:divide-stone-800 dark:border-stone-700"
          aria-label="Matching parts"
        >
          {data.rows.map((p) => (
            <li key={p.id}>
              <button
                type="button"
                className="block min-h-11 w-full px-3 py-2 text-left hover:bg-stone-100 dark:hover:bg-stone-800"
                onClick={() => onChange(p)}
              >
                {p.name} <span className="muted font-mono text-xs">{p.sku}</span>
                <span className="muted text-xs">
                  {' '}
                  · {p.tracking === 'unit' ? `${p.onHand} units on shelf` : `${formatQty(p.onHand, p.saleUnit)} on hand`}
                </span>
              </button>
            </li>
          ))}
          {data.rows.length === 0 ? <li className="muted px-3 py-2 text-sm">No part matches.</li> : null}
        </ul>
      ) : null}
      {isFetching ? <p className="muted text-xs">Searching…</p> : null}
      {error ? (
        <p
          id={`${id}-error`}
          role="alert"
          className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300"
        >
          {error}
        </p>
      ) : null}
    </div>
  );
}
