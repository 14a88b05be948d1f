'use client';
import { useState } from 'react';
import { MEASURE_SYMBOL, parseQtyInput, qtyInputMode, qtyStep, type Measure } from '@/lib/inventory/measure';

/**
 * A quantity typed in the part's unit: whole items take whole numbers, metres and grams take decimals
 * (up to three; a phone shows the decimal keyboard). The unit's symbol sits after the box. What is typed
 * stays as typed until it reads as a number, so "65." on the way to "65.5" is not thrown away.
 */
export function MeasuredQtyInput({
  id,
  measure,
  value,
  onChange,
  label,
  className = 'field w-28 text-right tabular-nums',
  min = 0,
  describedBy,
  invalid,
}: {
  id: string;
  measure: Measure;
  value: number | null;
  onChange: (qty: number | null) => void;
  /** An accessible name when no <label for> names the box. */
  label?: string;
  className?: string;
  min?: number;
  describedBy?: string;
  invalid?: boolean;
}) {
  const [text, setText] = useState(value === null ? '' : String(value));
  const [shown, setShown] = useState(value);
  // A change from outside (clamped to the shelf, a reload) shows; a partly typed number ("65.") does not
  // flicker back. Adjusted while rendering, React's way of following a prop.
  if (shown !== value) {
    setShown(value);
    if (parseQtyInput(text) !== value) setText(value === null ? '' : String(value));
  }
  const symbol = MEASURE_SYMBOL[measure];
  return (
    <span className="inline-flex items-center gap-1">
      <input
        id={id}
        type="number"
        inputMode={qtyInputMode(measure)}
        step={qtyStep(measure)}
        min={min}
        className={className}
        value={text}
        aria-label={label}
        aria-describedby={describedBy}
        aria-invalid={invalid || undefined}
        onChange={(e) => {
          setText(e.target.value);
          onChange(e.target.value.trim() === '' ? null : parseQtyInput(e.target.value));
        }}
      />
      {symbol ? <span aria-hidden>{symbol}</span> : null}
    </span>
  );
}
