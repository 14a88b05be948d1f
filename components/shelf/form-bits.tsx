'use client';
import type { FieldErrors } from './api';

export { Field } from '@/components/ui/field';

/** Props that point an input at its error and hint. */
export function describedBy(id: string, error?: string, hint?: string) {
  const ids = [error ? `${id}-error` : '', hint ? `${id}-hint` : ''].filter(Boolean).join(' ');
  return { 'aria-invalid': error ? true : undefined, 'aria-describedby': ids || undefined } as const;
}

/** The form-level message, and any field errors that have no input on this form. */
export function FormMessage({
  message,
  fields,
  shown = [],
  ok,
}: {
  message?: string;
  fields?: FieldErrors;
  shown?: string[];
  ok?: boolean;
}) {
  const rest = Object.entries(fields ?? {}).filter(([k]) => !shown.includes(k));
  if (!message && !rest.length) return null;
  return (
    <div
      role={ok ? 'status' : 'alert'}
      className={
        ok
          ? 'rounded-lg border border-green-700 bg-green-50 p-3 text-sm text-green-900 dark:bg-green-950 dark:text-green-200'
          : 'rounded-lg border border-red-700 bg-red-50 p-3 text-sm text-red-900 dark:bg-red-950 dark:text-red-200'
      }
    >
      {message ? <p className="font-semibold">{message}</p> : null}
      {rest.length ? (
        <ul className="mt-1 list-disc pl-5">
          {rest.map(([k, v]) => (
            <li key={k}>
              <code>{k}</code>: {v.join('; ')}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
