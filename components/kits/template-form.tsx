'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { callApi, type ApiError } from '@/components/loans/api';
import { ErrorNote } from '@/components/loans/error-note';
import { CHAIN_ROLE_WORDS } from '@/lib/domain';
import { minorUnitExponent, parseMoney } from '@/lib/money';

type Part = { id: string; name: string; sku: string; category: string; keySpec: string };
type Line = { partId: string; qty: number; chainRole: 'supply' | 'driver' | 'led' | 'wire' | null };
export type TemplateValues = {
  name: string;
  description: string;
  teachingNotes: string;
  cautions: string;
  depositMinor: number | null;
  lines: Line[];
};

const ROLES = ['supply', 'driver', 'led', 'wire'] as const;

// Steward's form for a kit template: the parts list, which lines form the chain, notes and cautions.
export function TemplateForm({
  parts,
  initial,
  templateId,
  currency,
}: {
  parts: Part[];
  initial?: TemplateValues;
  templateId?: string;
  /** The space's currency (ISO 4217): the deposit is typed in it. */
  currency: string;
}) {
  const router = useRouter();
  const ids = useId();
  const [v, setV] = useState<TemplateValues>(
    initial ?? { name: '', description: '', teachingNotes: '', cautions: '', depositMinor: null, lines: [] },
  );
  const exp = minorUnitExponent(currency);
  const [depositText, setDepositText] = useState(
    v.depositMinor === null ? '' : (v.depositMinor / 10 ** exp).toFixed(exp),
  );
  // An amount that does not parse is sent as typed, so the server names the field.
  const depositMinor = depositText.trim() === '' ? null : (parseMoney(depositText, currency) ?? Number.NaN);
  const body = { ...v, depositMinor: Number.isNaN(depositMinor) ? depositText : depositMinor };
  const m = useMutation({
    mutationFn: () =>
      templateId
        ? callApi<{ template: { id: string } }>(`/api/kits/templates/${templateId}`, 'PUT', body)
        : callApi<{ template: { id: string } }>('/api/kits/templates', 'POST', body),
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
      <div>
        <label className="label" htmlFor={`${ids}-deposit`}>
          Deposit before a box is lent ({currency}; empty: none)
        </label>
        <input
          id={`${ids}-deposit`}
          inputMode="decimal"
          className="field max-w-40"
          value={depositText}
          onChange={(e) => setDepositText(e.target.value)}
          aria-invalid={fields.depositMinor ? true : undefined}
          aria-describedby={fields.depositMinor ? `${ids}-depositMinor-err` : undefined}
        />
        {err('depositMinor')}
      </div>
      <button type="submit" className="btn-primary" disabled={m.isPending}>
        {m.isPending ? 'Saving…' : 'Save kit'}
      </button>
      <ErrorNote error={m.error} />
    </form>
  );
}
