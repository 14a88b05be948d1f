import { useId } from 'react';

/**
 * A number typed as text (so "1." and "3,2" can be typed), with its unit, how it was read ("= 300 000 Hz")
 * and any error beside it. `name` is the form field ("supply.volts"), also used to find it in tests.
 */
export function NumberField({
  name,
  label,
  unit,
  value,
  onChange,
  error,
  echo,
  hint,
  optional = false,
}: {
  name: string;
  label: string;
  unit?: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  echo?: string;
  hint?: string;
  optional?: boolean;
}) {
  const id = useId();
  const describedBy =
    [error ? `${id}-error` : null, echo && !error ? `${id}-echo` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  // The label grows so that inputs in one row line up however many lines their labels take.
  return (
    <div className="flex min-w-0 flex-col">
      <label htmlFor={id} className="label flex grow flex-col justify-end">
        <span>
          {label}
          {unit ? <span className="font-normal text-stone-600 dark:text-stone-400"> ({unit})</span> : null}
          {optional ? <span className="font-normal text-stone-600 dark:text-stone-400"> — optional</span> : null}
        </span>
        {hint ? (
          <span id={`${id}-hint`} className="text-xs font-normal text-stone-600 dark:text-stone-400">
            {hint}
          </span>
        ) : null}
      </label>
      <input
        id={id}
        name={name}
        data-field={name}
        className="field tabular-nums aria-invalid:border-2 aria-invalid:border-red-700 dark:aria-invalid:border-red-400"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
      />
      {error ? (
        <p id={`${id}-error`} data-error-for={name} className="mt-1 text-sm font-semibold break-words text-red-800 dark:text-red-300">
          {error}
        </p>
      ) : echo ? (
        <p id={`${id}-echo`} data-echo-for={name} className="mt-1 text-xs break-words text-stone-700 tabular-nums dark:text-stone-300">
          {echo}
        </p>
      ) : null}
    </div>
  );
}
