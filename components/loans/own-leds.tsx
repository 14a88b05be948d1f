'use client';
import { useId, useState } from 'react';
import { stringSpecSchema } from '@/lib/electrical';

// "Bringing your own LEDs? Say which": the member describes them with the check's own fields, checked
// in the browser with the same schema the server uses, then sent with the preview and the borrow.

export type OwnLedsValue = {
  count: number;
  led: {
    vfMin: number;
    vfTyp: number;
    vfMax: number;
    maxAmps: number;
    maxWatts: number;
    thermalOhmsJs?: number;
    maxJunctionC?: number;
  };
};

const FIELDS = [
  { key: 'count', label: 'How many, in series', unit: '', required: true },
  { key: 'vfMin', label: 'Forward voltage, min', unit: 'V', required: true },
  { key: 'vfTyp', label: 'Forward voltage, typ', unit: 'V', required: true },
  { key: 'vfMax', label: 'Forward voltage, max', unit: 'V', required: true },
  { key: 'maxAmps', label: 'Maximum current', unit: 'A', required: true },
  { key: 'maxWatts', label: 'Maximum power', unit: 'W', required: true },
  { key: 'thermalOhmsJs', label: 'Junction to solder point (optional)', unit: '°C/W', required: false },
  { key: 'maxJunctionC', label: 'Maximum junction (optional)', unit: '°C', required: false },
] as const;
type Key = (typeof FIELDS)[number]['key'];

/** "3,2" is 3.2 here: a comma decimal is a typing habit, not a different number. */
const toNumber = (s: string) => (s.trim() === '' ? undefined : Number(s.trim().replace(',', '.')));

export function OwnLeds({
  value,
  onChange,
}: {
  value: OwnLedsValue | null;
  onChange: (v: OwnLedsValue | null) => void;
}) {
  const ids = useId();
  const [draft, setDraft] = useState<Record<Key, string>>(
    () => Object.fromEntries(FIELDS.map((f) => [f.key, ''])) as Record<Key, string>,
  );
  const [errors, setErrors] = useState<Partial<Record<Key, string>>>({});

  const use = () => {
    const n = (k: Key) => toNumber(draft[k]);
    const led = Object.fromEntries(
      FIELDS.filter((f) => f.key !== 'count' && n(f.key) !== undefined).map((f) => [f.key, n(f.key)]),
    );
    const parsed = stringSpecSchema.safeParse({ count: n('count'), led });
    if (!parsed.success) {
      const found: Partial<Record<Key, string>> = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path[issue.path.length - 1] as Key;
        found[key] ??= issue.message;
      }
      for (const f of FIELDS)
        if (f.required && n(f.key) === undefined) found[f.key] = 'needed';
      setErrors(found);
      return;
    }
    setErrors({});
    onChange(parsed.data as OwnLedsValue);
  };

  return (
    <details className="card" open={value !== null || undefined}>
      <summary className="cursor-pointer text-lg font-bold">My own LEDs</summary>
      <p className="muted mt-1 text-sm">
        Bringing your own LEDs? Say which: they are checked with the supply and driver you borrow.
      </p>
      {value ? (
        <div className="mt-2 space-y-2" role="status">
          <p>
            Checked with your own {value.count} LEDs (Vf {value.led.vfMin}–{value.led.vfMax} V, up to{' '}
            {value.led.maxAmps} A, {value.led.maxWatts} W).
          </p>
          <button type="button" className="btn-quiet" onClick={() => onChange(null)}>
            Leave my own LEDs out
          </button>
        </div>
      ) : (
        <div className="mt-2 space-y-3">
          <div className="grid grid-cols-2 gap-2">
            {FIELDS.map((f) => (
              <div key={f.key} className="min-w-0">
                <label className="label" htmlFor={`${ids}-${f.key}`}>
                  {f.label}
                  {f.unit ? ` (${f.unit})` : ''}
                </label>
                <input
                  id={`${ids}-${f.key}`}
                  className="field"
                  inputMode="decimal"
                  autoComplete="off"
                  value={draft[f.key]}
                  aria-invalid={errors[f.key] ? true : undefined}
                  aria-describedby={errors[f.key] ? `${ids}-${f.key}-err` : undefined}
                  onChange={(e) => setDraft({ ...draft, [f.key]: e.target.value })}
                />
                {errors[f.key] ? (
                  <p id={`${ids}-${f.key}-err`} className="text-sm text-red-800 dark:text-red-300">
                    {errors[f.key]}
                  </p>
                ) : null}
              </div>
            ))}
          </div>
          <button type="button" className="btn-quiet" onClick={use}>
            Use my own LEDs
          </button>
        </div>
      )}
    </details>
  );
}
