'use client';
import { useId } from 'react';

/** Which label stock to print on, by our own layout names. */
export function LayoutSelect({
  layouts,
  value,
  onChange,
  className = 'field',
}: {
  layouts: { id: string; name: string }[];
  value: string;
  onChange: (id: string) => void;
  className?: string;
}) {
  const id = useId();
  return (
    <div>
      <label className="label" htmlFor={id}>
        Label layout
      </label>
      <select id={id} className={className} value={value} onChange={(e) => onChange(e.target.value)}>
        {layouts.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name}
          </option>
        ))}
      </select>
    </div>
  );
}
