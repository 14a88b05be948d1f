import { useId } from 'react';

/** A number typed as text (so "1." and "0,5" can be typed), with its unit and any error beside it. */
export function NumberField({
  label,
  unit,
  value,
  onChange,
  error,
  hint,
  optional = false,
}: {
  label: string;
  unit?: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  hint?: string;
  optional?: boolean;
}) {
  const id = useId();
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  // The label grows so that inputs in one row line up however many lines their labels take.
  return (
    <div className="flex flex-col">
      <label htmlFor={id} className="label flex grow flex-col justify-end">
        <span>
          {label}
          {unit ? <span className="font-normal text-stone-500 dark:text-stone-400"> ({unit})</span> : null}
          {optional ? <span className="font-normal text-stone-500 dark:text-stone-400"> — optional</span> : null}
        </span>
        {hint ? (
          <span id={`${id}-hint`} className="text-xs font-normal text-stone-500 dark:text-stone-400">
            {hint}
          </span>
        ) : null}
      </label>
      <input
        id={id}
        className="field tabular-nums aria-invalid:border-red-700 dark:aria-invalid:border-red-400"
        inputMode="decimal"
        autoComplete="off"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
      />
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300">
          {error}
        </p>
      ) : null}
    </div>
  );
}
