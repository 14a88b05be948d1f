'use client';
import { formatQty, qtyInputMode, qtyStep } from '@/lib/inventory/measure';
import { useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useState } from 'react';
import { api } from './api';
import { CodeText } from './code-text';
import { describedBy, Field, FormMessage } from './form-bits';
import { PrintLabelsButton } from './print-labels-button';
import { PartPicker, type PickedPart } from './part-picker';
import { useApiForm } from './use-api-form';

type Location = { id: string; name: string };

/**
 * Receive stock into a bin, or move it between bins. A labelled part received here gets new units
 * (each with a code); moving one labelled unit is done by its code.
 */
export function StockForm({
  mode,
  locations,
  initialPart,
  labels,
}: {
  mode: 'receive' | 'move';
  locations: Location[];
  initialPart: PickedPart | null;
  /** Label layouts, so new units' labels print from here in one step. */
  labels?: { layouts: { id: string; name: string }[]; defaultLayout: string };
}) {
  const queryClient = useQueryClient();
  const [part, setPart] = useState<PickedPart | null>(initialPart);
  // The units labelled by the last receive: their codes, listed with a button printing exactly those.
  const [newUnits, setNewUnits] = useState<{ partName: string; codes: string[] } | null>(null);
  const form = useApiForm();
  const { err, busy } = form;

  /** The request this form makes for the chosen part, and what to say when it succeeds. */
  async function submitFor(p: PickedPart, get: (k: string) => string): Promise<string> {
    if (mode === 'receive') {
      // One receive service for both kinds: a labelled part gets new units and answers their codes.
      const r = await api<{ qty: number; units: { code: string }[] }>('/api/stock/receive', {
        body: {
          partId: p.id,
          locationId: get('locationId') || null,
          qty: Number(get('qty')),
          note: get('note'),
        },
      });
      if (p.tracking === 'unit') {
        setNewUnits({ partName: p.name, codes: r.units.map((u) => u.code) });
        return `${r.units.length} new unit${r.units.length === 1 ? '' : 's'} of ${p.name} labelled. Print their labels below.`;
      }
      return `Received. That bin now holds ${formatQty(r.qty, p.saleUnit)} of ${p.name}.`;
    }
    const r = await api<{ fromQty: number; toQty: number }>('/api/stock/move', {
      body: {
        partId: p.id,
        fromLocationId: get('fromLocationId'),
        toLocationId: get('toLocationId'),
        qty: Number(get('qty')),
        note: get('note'),
      },
    });
    return `Moved. ${r.fromQty} left in the first bin, ${r.toQty} in the second.`;
  }

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const data = new FormData(formEl);
    if (!part) return form.fail('Choose a part first.', { partId: ['choose a part'] });
    setNewUnits(null);
    const done = await form.run(
      () => submitFor(part, (k) => String(data.get(k) ?? '')),
      (message) => message,
    );
    if (done === undefined) return;
    (formEl.elements.namedItem('qty') as HTMLInputElement | null)?.select();
    await queryClient.invalidateQueries({ queryKey: ['part-pick'] });
  }

  const moveUnits = mode === 'move' && part?.tracking === 'unit';
  const binSelect = (name: string, label: string) => (
    <Field id={name} label={label} error={err(name)}>
      <select id={name} name={name} className="field" required {...describedBy(name, err(name))}>
        {mode === 'receive' && part?.tracking === 'unit' ? <option value="">No bin yet</option> : null}
        {locations.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name}
          </option>
        ))}
      </select>
    </Field>
  );

  return (
    <div className="max-w-2xl space-y-4">
    <form onSubmit={onSubmit} className="card space-y-4" noValidate>
      <FormMessage
        message={form.message}
        fields={form.fields}
        shown={['partId', 'qty', 'locationId', 'fromLocationId', 'toLocationId', 'note', 'count']}
        ok={form.ok}
      />
      <Field id="part" label="Part" error={undefined}>
        <PartPicker id="part" value={part} onChange={setPart} error={err('partId')} />
      </Field>
      {moveUnits ? (
        <p className="text-sm">
          Labelled units move one by one: open the unit from <Link href="/scan">Scan</Link> or from the{' '}
          <Link href={`/shelf/parts/${part!.id}`}>part page</Link>.
        </p>
      ) : (
        <>
          <div className="grid gap-4 sm:grid-cols-2">
            {mode === 'receive' ? binSelect('locationId', 'Into bin') : null}
            {mode === 'move' ? binSelect('fromLocationId', 'From bin') : null}
            {mode === 'move' ? binSelect('toLocationId', 'To bin') : null}
            <Field
              id="qty"
              label={
                part?.tracking === 'unit'
                  ? 'New units to label'
                  : part?.saleUnit === 'metre'
                    ? 'Metres (m)'
                    : part?.saleUnit === 'gram'
                      ? 'Grams (g)'
                      : 'Quantity'
              }
              error={err('qty') ?? err('count')}
            >
              <input
                id="qty"
                name="qty"
                type="number"
                min={part?.tracking === 'unit' ? 1 : 0}
                step={qtyStep(part?.tracking === 'unit' ? 'each' : (part?.saleUnit ?? 'each'))}
                inputMode={qtyInputMode(part?.tracking === 'unit' ? 'each' : (part?.saleUnit ?? 'each'))}
                defaultValue={1}
                className="field"
                required
                {...describedBy('qty', err('qty') ?? err('count'))}
              />
            </Field>
          </div>
          {part?.tracking !== 'unit' ? (
            <Field id="note" label="Note (optional)" error={err('note')}>
              <input
                id="note"
                name="note"
                className="field"
                placeholder={mode === 'receive' ? 'e.g. order 114' : 'e.g. topping up the bench drawer'}
              />
            </Field>
          ) : null}
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? 'Saving…' : mode === 'receive' ? 'Receive' : 'Move'}
          </button>
        </>
      )}
    </form>
    {newUnits && labels ? (
      <section className="card space-y-3" aria-labelledby="new-units">
        <h2 id="new-units" className="text-lg font-bold">
          New labels for {newUnits.partName}
        </h2>
        <ul className="flex flex-wrap gap-x-4 gap-y-1" aria-label="New unit codes">
          {newUnits.codes.map((c) => (
            <li key={c}>
              <CodeText code={c} />
            </li>
          ))}
        </ul>
        <PrintLabelsButton
          selection={{ kind: 'codes', codes: newUnits.codes }}
          expected={newUnits.codes.length}
          layouts={labels.layouts}
          defaultLayout={labels.defaultLayout}
          label={`Print these ${newUnits.codes.length} label${newUnits.codes.length === 1 ? '' : 's'}`}
        />
      </section>
    ) : null}
    </div>
  );
}
