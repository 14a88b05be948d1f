// A label, its control, a hint and the control's error, tied together for screen readers.
// Used by every form (shelf, kits, people, settings).
/** A labelled input with its error beneath, tied together for screen readers. */
export function Field({
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
  children: React.ReactNode;
}) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      {children}
      {hint ? (
        <p id={`${id}-hint`} className="muted mt-1 text-xs">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p
          id={`${id}-error`}
          role="alert"
          className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300"
        >
          {error}
        </p>
      ) : null}
    </div>
  );
}
