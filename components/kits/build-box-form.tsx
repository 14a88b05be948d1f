'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { callApi } from '@/components/loans/api';
import { ErrorNote } from '@/components/loans/error-note';

// Steward: build a box from a kit. The free labelled units and the counted stock it needs leave the
// shelf in one go; the box gets its own label.
export function BuildBoxForm({
  templates,
  locations,
}: {
  templates: { id: string; name: string }[];
  locations: { id: string; name: string }[];
}) {
  const router = useRouter();
  const ids = useId();
  const [templateId, setTemplateId] = useState(templates[0]?.id ?? '');
  const [name, setName] = useState('');
  const [locationId, setLocationId] = useState('');
  const m = useMutation({
    mutationFn: () =>
      callApi<{ box: { id: string } }>('/api/kits/boxes', 'POST', {
        templateId,
        ...(name.trim() ? { name: name.trim() } : {}),
        ...(locationId ? { locationId } : {}),
      }),
    onSuccess: ({ box }) => router.push(`/kits/boxes/${box.id}`),
  });
  return (
    <form
      className="card space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate();
      }}
    >
      <div>
        <label className="label" htmlFor={`${ids}-t`}>
          Kit
        </label>
        <select
          id={`${ids}-t`}
          className="field"
          value={templateId}
          onChange={(e) => setTemplateId(e.target.value)}
        >
          {templates.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor={`${ids}-n`}>
          Box name (optional)
        </label>
        <input
          id={`${ids}-n`}
          className="field"
          value={name}
          onChange={(e) => setName(e.target.value)}
          placeholder="e.g. Desk lamp box 3"
        />
      </div>
      <div>
        <label className="label" htmlFor={`${ids}-l`}>
          Kept on (optional)
        </label>
        <select
          id={`${ids}-l`}
          className="field"
          value={locationId}
          onChange={(e) => setLocationId(e.target.value)}
        >
          <option value="">—</option>
          {locations.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-primary" disabled={!templateId || m.isPending}>
        {m.isPending ? 'Building…' : 'Build the box'}
      </button>
      <ErrorNote error={m.error} />
    </form>
  );
}
