'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError, callApi, errorText, fieldError, type FieldErrors } from '@/components/ui/api';
import { Field } from '@/components/ui/field';

const FIELDS = [
  { name: 'spaceName', label: 'Name of the space', type: 'text', autoComplete: 'organization' },
  { name: 'adminName', label: 'Your name', type: 'text', autoComplete: 'name' },
  { name: 'adminEmail', label: 'Your e-mail', type: 'email', autoComplete: 'email' },
  { name: 'password', label: 'Password (at least 10 characters)', type: 'password', autoComplete: 'new-password' },
] as const;

export function FirstRunForm({ currencies, timeZones }: { currencies: string[]; timeZones: string[] }) {
  const router = useRouter();
  const [fields, setFields] = useState<FieldErrors>({});
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = Object.fromEntries(new FormData(e.currentTarget)) as Record<string, string>;
    setBusy(true);
    setError('');
    setFields({});
    try {
      await callApi('/api/first-run', 'POST', data);
      router.push('/signin');
    } catch (err) {
      setBusy(false);
      if (err instanceof ApiError && err.status === 404) setError('The space has been set up already. Sign in instead.');
      else setError(errorText(err));
      if (err instanceof ApiError) setFields(err.fields);
    }
  }

  return (
    <form onSubmit={onSubmit} className="card mt-6 space-y-4" noValidate>
      {FIELDS.slice(0, 1).map((f) => (
        <Field key={f.name} id={f.name} label={f.label} error={fieldError(fields, f.name)}>
          <input id={f.name} name={f.name} type={f.type} autoComplete={f.autoComplete} required className="field" />
        </Field>
      ))}
      <Field id="currency" label="Currency" error={fieldError(fields, 'currency')}>
        <select id="currency" name="currency" defaultValue="EUR" className="field">
          {currencies.map((c) => (
            <option key={c}>{c}</option>
          ))}
        </select>
      </Field>
      <Field id="timeZone" label="Time zone" error={fieldError(fields, 'timeZone')}>
        <select id="timeZone" name="timeZone" defaultValue="UTC" className="field">
          {timeZones.map((z) => (
            <option key={z}>{z}</option>
          ))}
        </select>
      </Field>
      <Field id="closingTime" label="Closing time (loans are due by then)" error={fieldError(fields, 'closingTime')}>
        <input id="closingTime" name="closingTime" type="time" defaultValue="20:00" required className="field" />
      </Field>
      {FIELDS.slice(1).map((f) => (
        <Field key={f.name} id={f.name} label={f.label} error={fieldError(fields, f.name)}>
          <input id={f.name} name={f.name} type={f.type} autoComplete={f.autoComplete} required className="field" />
        </Field>
      ))}
      {error ? (
        <p role="alert" className="rounded-md border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-100">
          {error}
        </p>
      ) : null}
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? 'Setting up…' : 'Create the space'}
      </button>
    </form>
  );
}
