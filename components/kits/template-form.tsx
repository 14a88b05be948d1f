'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { callApi, type ApiError } from '@/components/loans/api';
import { ErrorNote } from '@/components/loans/error-note';
import { CHAIN_ROLE_WORDS } from '@/lib/domain';

type Part = { id: string; name: string; sku: string; category: string; keySpec: string };
type Line = { partId: string; qty: number; chainRole: 'supply' | 'driver' | 'led' | 'wire' | null };
export type TemplateValues = {
  name: string;
  description: string;
  teachingNotes: string;
  cautions: string;
  lines: Line[];
};

const ROLES = ['supply', 'driver', 'led', 'wire'] as const;

// Steward's form for a kit template: the parts list, which lines form the chain, notes and cautions.
export function TemplateForm({
  parts,
  initial,
  templateId,
}: {
  parts: Part[];
  initial?: TemplateValues;
  templateId?: string;
}) {
  const router = useRouter();
  const ids = useId();
  const [v, setV] = useState<TemplateValues>(
    initial ?? { name: '', description: '', teachingNotes: '', cautions: '', lines: [] },
  );
  const m = useMutation({
    mutationFn: () =>
      templateId
        ? callApi<{ template: { id: string } }>(`/api/kits/templates/${templateId}`, 'PUT', v)
        : callApi<{ template: { id: string } }>('/api/kits/templates', 'POST', v),
    onSuccess: ({ template }) => router.push(`/kits/templates/${template.id}`),
  });
  const fields = (m.error as ApiError | null)?.fields ?? {};
  const err = (key: string) =>
    fields[key] ? (
      <p className="text-sm text-red-800 dark:text-red-300" id={`${ids}-${key}-err`}>
        {fields[key].join(' ')}
      </p>
    ) : null;
  const setLine = (i: number, patch: Partial<Line>) =>
    setV({ ...v, lines: v.lines.map((l, j) => (j === i ? { ...l, ...patch } : l)) });
  const text = (key: 'name' | 'description' | 'teachingNotes' | 'cautions', label: string, rows = 0) => (
    <div>
      <label className="label" htmlFor={`${ids}-${key}`}>
        {label}
      </label>
      {rows ? (
        <textarea
          id={`${ids}-${key}`}
          className="field"
          rows={rows}
          value={v[key]}
          onChange={(e) => setV({ ...v, [key]: e.target.value })}
        />
      ) : (
        <input
          id={`${ids}-${key}`}
          className="field"
          value={v[key]}
          onChange={(e) => setV({ ...v, [key]: e.target.value })}
        />
      )}
      {err(key)}
    </div>
  );

  return (
    <form
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate();
      }}
    >
      {text('name', 'Name')}
      {text('description', 'Short description', 2)}
      <fieldset className="card space-y-3">
        <legend className="px-1 font-bold">Parts list</legend>
        {err('lines')}
        {v.lines.map((l, i) => (
          <div key={i} className="grid gap-2 sm:grid-cols-[1fr_6rem_9rem_auto] sm:items-end">
            <div>
              <label className="label" htmlFor={`${ids}-part-${i}`}>
                Part
              </label>
              <select
                id={`${ids}-part-${i}`}
                className="field"
                value={l.partId}
                onChange={(e) => setLine(i, { partId: e.target.value })}
              >
                <option value="">Choose a part…</option>
                {parts.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.name} ({p.sku})
                  </option>
                ))}
              </select>
              {err(`lines.${i}.partId`)}
            </div>
            <div>
              <label className="label" htmlFor={`${ids}-qty-${i}`}>
                Qty
              </label>
              <input
                id={`${ids}-qty-${i}`}
                className="field"
                type="number"
                min={1}
                value={l.qty}
                onChange={(e) => setLine(i, { qty: Number(e.target.value) })}
              />
            </div>
            <div>
              <label className="label" htmlFor={`${ids}-role-${i}`}>
                What it does in the build
              </label>
              <select
                id={`${ids}-role-${i}`}
                className="field"
                value={l.chainRole ?? ''}
                onChange={(e) => setLine(i, { chainRole: (e.target.value || null) as Line['chainRole'] })}
              >
                <option value="">nothing (not part of the build)</option>
                {ROLES.map((r) => (
                  <option key={r} value={r}>
                    {CHAIN_ROLE_WORDS[r]}
                  </option>
                ))}
              </select>
              {err(`lines.${i}.chainRole`)}
            </div>
            <button
              type="button"
              className="btn-quiet"
              onClick={() => setV({ ...v, lines: v.lines.filter((_, j) => j !== i) })}
            >
              Remove
            </button>
          </div>
        ))}
        <button
          type="button"
          className="btn-quiet"
          onClick={() => setV({ ...v, lines: [...v.lines, { partId: '', qty: 1, chainRole: null }] })}
        >
          Add a line
        </button>
      </fieldset>
      {text('teachingNotes', 'Teaching notes (how to build it, what to measure)', 5)}
      {text('cautions', 'Safety cautions for this kit', 3)}
      <button type="submit" className="btn-primary" disabled={m.isPending}>
        {m.isPending ? 'Saving…' : 'Save kit'}
      </button>
      <ErrorNote error={m.error} />
    </form>
  );
}
