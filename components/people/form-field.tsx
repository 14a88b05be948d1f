import type { ReactNode } from 'react';

/** A label, its control and the control's error message, tied together for screen readers. */
export function FormField({
  id,
  label,
  error,
  hint,
  children,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  children: ReactNode;
}) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${id}-hint`} className="muted mt-1 text-sm">
          {hint}
        </p>
      ) : null}
      {error ? <InlineError id={`${id}-error`}>{error}</InlineError> : null}
    </div>
  );
}

/** aria props for a control inside FormField. */
export function describedBy(id: string, error?: string, hasHint = false) {
  return {
    id,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': error ? `${id}-error` : hasHint ? `${id}-hint` : undefined,
  } as const;
}

/** A form-wide message: an error (alert) or a confirmation (status). */
export function FormNote({ kind, children }: { kind: 'error' | 'ok'; children: ReactNode }) {
  return kind === 'error' ? (
    <p
      role="alert"
      className="rounded-md border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-100"
    >
      {children}
    </p>
  ) : (
    <p role="status" className="rounded-md border border-accent bg-accent-soft p-2 text-sm text-stone-900">
      {children}
    </p>
  );
}

/** A short error beside the control it is about; `alert` when it appears after an action. */
export function InlineError({ id, alert, children }: { id?: string; alert?: boolean; children: ReactNode }) {
  return (
    <p
      id={id}
      role={alert ? 'alert' : undefined}
      className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300"
    >
      {children}
    </p>
  );
}
