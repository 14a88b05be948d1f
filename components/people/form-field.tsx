import type { ReactNode } from 'react';

/** The shared labelled field (components/ui/field.tsx). */
export { Field as FormField } from '@/components/ui/field';

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
