'use client';
import { useId, useState } from 'react';
import { driverSpecSchema, supplySpecSchema, type DriverSpec, type SupplySpec } from '@/lib/electrical';

// "Bringing your own supply or driver? Say which": described with the check's own fields, checked in the
// browser with the schema the server uses, then sent with the preview and the borrow as own parts.

type Field = { key: string; label: string; unit: string; required: boolean };
type DriverType = DriverSpec['type'];

const SUPPLY_FIELDS: Field[] = [
  { key: 'volts', label: 'Output voltage', unit: 'V', required: true },
  { key: 'maxAmps', label: 'Rated current', unit: 'A', required: true },
  { key: 'tolerancePct', label: 'Tolerance (optional)', unit: '%', required: false },
];
const DRIVER_FIELDS: Record<DriverType, Field[]> = {
  buck: [
    { key: 'outputAmps', label: 'Output current', unit: 'A', required: true },
    { key: 'minInputVolts', label: 'Input, min', unit: 'V', required: true },
    { key: 'maxInputVolts', label: 'Input, max', unit: 'V', required: true },
  ],
  linear: [
    { key: 'outputAmps', label: 'Output current', unit: 'A', required: true },
    { key: 'maxInputVolts', label: 'Input, max', unit: 'V', required: true },
    { key: 'dropoutVolts', label: 'Dropout', unit: 'V', required: true },
  ],
  resistor: [
    { key: 'ohms', label: 'Resistance', unit: 'Ω', required: true },
    { key: 'watts', label: 'Power rating', unit: 'W', required: true },
  ],
};
const DRIVER_NAMES: Record<DriverType, string> = {
  buck: 'Buck (switching) driver',
  linear: 'Linear driver',
  resistor: 'Series resistor',
};

/** "3,2" is 3.2 here: a comma decimal is a typing habit, not a different number. */
const toNumber = (s: string) => (s.trim() === '' ? undefined : Number(s.trim().replace(',', '.')));

type Parsed<T> = { ok: true; value: T } | { ok: false; errors: Record<string, string> };

function parseFields<T>(
  fields: Field[],
  draft: Record<string, string>,
  extra: Record<string, unknown>,
  schema: { safeParse: (x: unknown) => { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[]; message: string }[] } } },
): Parsed<T> {
  const numbers = Object.fromEntries(
    fields.map((f) => [f.key, toNumber(draft[f.key] ?? '')]).filter(([, v]) => v !== undefined),
  );
  const errors: Record<string, string> = {};
  for (const f of fields) if (f.required && numbers[f.key] === undefined) errors[f.key] = 'needed';
  const parsed = schema.safeParse({ ...extra, ...numbers });
  if (!parsed.success)
    for (const issue of parsed.error.issues) {
      const key = String(issue.path[issue.path.length - 1] ?? fields[0].key);
      errors[key] ??= issue.message;
    }
  if (Object.keys(errors).length || !parsed.success) return { ok: false, errors };
  return { ok: true, value: parsed.data };
}

function Fields({
  ids,
  fields,
  draft,
  errors,
  onChange,
}: {
  ids: string;
  fields: Field[];
  draft: Record<string, string>;
  errors: Record<string, string>;
  onChange: (key: string, v: string) => void;
}) {
  return (
    <div className="grid grid-cols-2 gap-2">
      {fields.map((f) => (
        <div key={f.key} className="min-w-0">
          <label className="label" htmlFor={`${ids}-${f.key}`}>
            {f.label} ({f.unit})
          </label>
          <input
            id={`${ids}-${f.key}`}
            className="field"
            inputMode="decimal"
            autoComplete="off"
            value={draft[f.key] ?? ''}
            aria-invalid={errors[f.key] ? true : undefined}
            aria-describedby={errors[f.key] ? `${ids}-${f.key}-err` : undefined}
            onChange={(e) => onChange(f.key, e.target.value)}
          />
          {errors[f.key] ? (
            <p id={`${ids}-${f.key}-err`} className="text-sm text-red-800 dark:text-red-300">
              {errors[f.key]}
            </p>
          ) : null}
        </div>
      ))}
    </div>
  );
}

export function OwnSupply({ value, onChange }: { value: SupplySpec | null; onChange: (v: SupplySpec | null) => void }) {
  const ids = useId();
  const [draft, setDraft] = useState<Record<string, string>>({});
  const [errors, setErrors] = useState<Record<string, string>>({});
  const use = () => {
    const r = parseFields<SupplySpec>(SUPPLY_FIELDS, draft, {}, supplySpecSchema);
    setErrors(r.ok ? {} : r.errors);
    if (r.ok) onChange(r.value);
  };
  return (
    <details className="card" open={value !== null || undefined}>
      <summary className="cursor-pointer text-lg font-bold">My own supply</summary>
      <p className="muted mt-1 text-sm">Bringing your own DC supply? Say which: it is checked with the parts you borrow.</p>
      {value ? (
        <div className="mt-2 space-y-2" role="status">
          <p>
            Checked with your own {value.volts} V supply, rated {value.maxAmps} A.
          </p>
          <button type="button" className="btn-quiet" onClick={() => onChange(null)}>
            Leave my own supply out
          </button>
        </div>
      ) : (
        <div className="mt-2 space-y-3">
          <Fields ids={ids} fields={SUPPLY_FIELDS} draft={draft} errors={errors} onChange={(k, v) => setDraft({ ...draft, [k]: v })} />
          <button type="button" className="btn-quiet" onClick={use}>
            Use my own supply
          </button>
        </div>
      )}
    </details>
  );
}

export function OwnDriver({ value, onChange }: { value: DriverSpec | null; onChange: (v: DriverSpec | null) => void }) {
  const ids = useId();
  const [type, setType] = useState<DriverType>('buck');
  const [draft, setDraft] = useState<Record<string, string>>({});
  const [errors, setErrors] = useState<Record<string, string>>({});
  const fields = DRIVER_FIELDS[type];
  const use = () => {
    const r = parseFields<DriverSpec>(fields, draft, { type }, driverSpecSchema);
    setErrors(r.ok ? {} : r.errors);
    if (r.ok) onChange(r.value);
  };
  return (
    <details className="card" open={value !== null || undefined}>
      <summary className="cursor-pointer text-lg font-bold">My own driver</summary>
      <p className="muted mt-1 text-sm">
        Bringing your own driver or resistor? Say which: it is checked with the parts you borrow.
      </p>
      {value ? (
        <div className="mt-2 space-y-2" role="status">
          <p>Checked with your own {DRIVER_NAMES[value.type].toLowerCase()}.</p>
          <button type="button" className="btn-quiet" onClick={() => onChange(null)}>
            Leave my own driver out
          </button>
        </div>
      ) : (
        <div className="mt-2 space-y-3">
          <div>
            <label className="label" htmlFor={`${ids}-type`}>
              Kind
            </label>
            <select
              id={`${ids}-type`}
              className="field"
              value={type}
              onChange={(e) => {
                setType(e.target.value as DriverType);
                setErrors({});
              }}
            >
              {(Object.keys(DRIVER_NAMES) as DriverType[]).map((t) => (
                <option key={t} value={t}>
                  {DRIVER_NAMES[t]}
                </option>
              ))}
            </select>
          </div>
          <Fields ids={ids} fields={fields} draft={draft} errors={errors} onChange={(k, v) => setDraft({ ...draft, [k]: v })} />
          <button type="button" className="btn-quiet" onClick={use}>
            Use my own driver
          </button>
        </div>
      )}
    </details>
  );
}
