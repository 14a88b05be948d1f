'use client';
import { useRouter } from 'next/navigation';
import { formatQty, qtyStep, type Measure } from '@/lib/inventory/measure';
import { api } from './api';
import { describedBy, Field, FormMessage } from './form-bits';
import { useApiForm } from './use-api-form';

/** A correction with a reason: a found surplus (+) or lost, damaged, miscounted stock (−). */
export function AdjustForm({
  partId,
  locations,
  measure = 'each',
}: {
  partId: string;
  locations: { id: string; name: string; qty?: number }[];
  /** Metres and grams change by decimals; whole items by whole numbers. */
  measure?: Measure;
}) {
  const router = useRouter();
  const form = useApiForm();
  const err = form.err;

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const data = new FormData(formEl);
    const r = await form.run(
      () =>
        api<{ qty: number }>('/api/stock/adjust', {
          body: {
            partId,
            locationId: String(data.get('locationId') ?? ''),
            delta: Number(data.get('delta')),
            reason: String(data.get('reason') ?? 'adjust'),
            note: String(data.get('note') ?? ''),
          },
        }),
      (r) => `Adjusted: ${formatQty(r.qty, measure)} now in that bin.`,
    );
    if (r) {
      formEl.reset();
      router.refresh();
    }
  }

  return (
    <form onSubmit={onSubmit} className="grid gap-3 sm:grid-cols-5 sm:items-end" noValidate>
      <Field id="adj-location" label="Bin" error={err('locationId')}>
        <select id="adj-location" name="locationId" className="field">
          {locations.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
              {l.qty !== undefined ? ` (${formatQty(l.qty, measure)})` : ''}
            </option>
          ))}
        </select>
      </Field>
      <Field
        id="adj-delta"
        label={`Change (+ or −)${measure === 'metre' ? ', in metres' : measure === 'gram' ? ', in grams' : ''}`}
        error={err('delta')}
      >
        <input
          id="adj-delta"
          name="delta"
          type="number"
          step={qtyStep(measure)}
          inputMode={measure === 'each' ? undefined : 'text'}
          className="field"
          placeholder="-2"
          {...describedBy('adj-delta', err('delta'))}
        />
      </Field>
      <Field id="adj-reason" label="Reason" error={err('reason')}>
        <select id="adj-reason" name="reason" className="field">
          <option value="adjust">Correction</option>
          <option value="lost">Lost</option>
          <option value="damaged">Damaged</option>
        </select>
      </Field>
      <Field id="adj-note" label="Why" error={err('note')}>
        <input
          id="adj-note"
          name="note"
          className="field"
          placeholder="e.g. two found cracked"
          {...describedBy('adj-note', err('note'))}
        />
      </Field>
      <button type="submit" className="btn-quiet">
        Adjust
      </button>
      <div className="sm:col-span-5">
        <FormMessage
          message={form.message}
          fields={form.fields}
          shown={['locationId', 'delta', 'reason', 'note']}
          ok={form.ok}
        />
      </div>
    </form>
  );
}
