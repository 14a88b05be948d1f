'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { LOCATION_KINDS } from '@/lib/inventory/words';
import { api, ApiError } from './api';
import { describedBy, Field, FormMessage } from './form-bits';
import { useApiForm } from './use-api-form';

/** Adds a bin, shelf or drawer; it gets its own label code. */
export function NewLocationForm() {
  const router = useRouter();
  const form = useApiForm();

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const data = new FormData(formEl);
    const r = await form.run(
      () =>
        api<{ name: string }>('/api/locations', {
          body: { name: String(data.get('name') ?? ''), kind: String(data.get('kind') ?? 'bin') },
        }),
      (r) => `${r.name} added.`,
    );
    if (r) {
      formEl.reset();
      router.refresh();
    }
  }
  return (
    <form onSubmit={onSubmit} className="card flex flex-wrap items-end gap-3" noValidate>
      <Field id="loc-name" label="Name" error={form.err('name')}>
        <input
          id="loc-name"
          name="name"
          className="field"
          placeholder="Bin D2 · wire"
          {...describedBy('loc-name', form.err('name'))}
        />
      </Field>
      <Field id="loc-kind" label="Kind">
        <select id="loc-kind" name="kind" className="field">
          {LOCATION_KINDS.map((k) => (
            <option key={k}>{k}</option>
          ))}
        </select>
      </Field>
      <button type="submit" className="btn-primary">
        Add location
      </button>
      <div className="w-full">
        <FormMessage message={form.message} fields={form.fields} shown={['name', 'kind']} ok={form.ok} />
      </div>
    </form>
  );
}

/** Rename or remove one location (removing works only when it is empty). */
export function LocationActions({ id, name }: { id: string; name: string }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const [value, setValue] = useState(name);
  const [error, setError] = useState('');

  async function run(p: Promise<unknown>) {
    setError('');
    try {
      await p;
      setEditing(false);
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'Could not reach the server.');
    }
  }
  return (
    <div className="flex flex-wrap items-center gap-2">
      {editing ? (
        <form
          className="flex flex-wrap gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            void run(api(`/api/locations/${id}`, { method: 'PATCH', body: { name: value } }));
          }}
        >
          <label className="sr-only" htmlFor={`rename-${id}`}>
            New name for {name}
          </label>
          <input
            id={`rename-${id}`}
            className="field w-48"
            value={value}
            onChange={(e) => setValue(e.target.value)}
          />
          <button type="submit" className="btn-quiet">
            Save
          </button>
        </form>
      ) : (
        <button type="button" className="btn-quiet" onClick={() => setEditing(true)}>
          Rename
        </button>
      )}
      <button
        type="button"
        className="btn-quiet"
        onClick={() =>
          window.confirm(`Remove ${name}?`) && void run(api(`/api/locations/${id}`, { method: 'DELETE' }))
        }
      >
        Remove
      </button>
      {error ? (
        <p role="alert" className="w-full text-sm font-semibold text-red-800 dark:text-red-300">
          {error}
        </p>
      ) : null}
    </div>
  );
}
