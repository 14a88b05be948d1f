'use client';
import { useRouter } from 'next/navigation';
import { api } from './api';
import { describedBy, Field, FormMessage } from './form-bits';
import { useApiForm } from './use-api-form';

/** Labels more units of a labelled part. */
export function AddUnitsForm({
  partId,
  locations,
}: {
  partId: string;
  locations: { id: string; name: string }[];
}) {
  const router = useRouter();
  const form = useApiForm();

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const r = await form.run(
      () =>
        api<{ units: unknown[] }>(`/api/parts/${partId}/units`, {
          body: {
            count: Number(data.get('count') || 0),
            locationId: String(data.get('locationId') || '') || null,
          },
        }),
      (r) => `${r.units.length} unit${r.units.length === 1 ? '' : 's'} added; print their labels above.`,
    );
    if (r) router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-wrap items-end gap-3">
      <Field id="add-count" label="Add units" error={form.err('count')}>
        <input
          id="add-count"
          name="count"
          type="number"
          min={1}
          max={500}
          defaultValue={1}
          className="field w-28"
          {...describedBy('add-count', form.err('count'))}
        />
      </Field>
      <Field id="add-location" label="Into" error={form.err('locationId')}>
        <select id="add-location" name="locationId" className="field">
          <option value="">No bin yet</option>
          {locations.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </select>
      </Field>
      <button type="submit" className="btn-quiet">
        Label new units
      </button>
      <div className="w-full">
        <FormMessage
          message={form.message}
          fields={form.fields}
          shown={['count', 'locationId']}
          ok={form.ok}
        />
      </div>
    </form>
  );
}
