'use client';
import { MEASURE_CHOICES, MEASURES } from '@/lib/inventory/measure';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { PartCategory } from '@/lib/domain';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';
import { CATEGORIES, CATEGORY_WORDS, SPEC_FIELDS } from '@/lib/inventory/words';
import { api } from './api';
import { describedBy, Field, FormMessage } from './form-bits';
import { useApiForm } from './use-api-form';

export type PartFormValues = {
  sku: string;
  name: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  specs: Record<string, unknown>;
  sellable: boolean;
  lendable: boolean;
  priceMinor: number | null;
  saleUnit: string;
  reorderPoint: number;
  notes: string;
};

const EMPTY: PartFormValues = {
  sku: '',
  name: '',
  category: 'driver',
  tracking: 'unit',
  specs: {},
  sellable: false,
  lendable: true,
  priceMinor: null,
  saleUnit: 'each',
  reorderPoint: 0,
  notes: '',
};

/** A typed number stays a number; anything else goes to the server as typed, to be named in its answer. */
const specInput = (v: FormDataEntryValue | null) => {
  const s = String(v ?? '').trim();
  if (s === '') return undefined;
  const n = Number(s.replace(',', '.'));
  return Number.isFinite(n) ? n : s;
};

/** Add or edit a part; the specs offered follow the category, and the server's errors land on their fields. */
export function PartForm({
  partId,
  initial = EMPTY,
  locations,
  currency,
}: {
  partId?: string;
  initial?: PartFormValues;
  locations: { id: string; name: string }[];
  currency: string;
}) {
  const router = useRouter();
  const [category, setCategory] = useState<PartCategory>(initial.category);
  const [tracking, setTracking] = useState(initial.tracking);
  const [sellable, setSellable] = useState(initial.sellable);
  const [driverType, setDriverType] = useState(String(initial.specs.type ?? 'buck'));
  const form = useApiForm();
  const { err, busy } = form;
  // A driver's fields follow its type (a series resistor has no input range, a buck no dropout).
  const specFields = (SPEC_FIELDS[category] ?? []).filter((f) => !f.types || f.types.includes(driverType));

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const specs: Record<string, unknown> = {};
    for (const f of specFields) {
      if (f.kind === 'bool') specs[f.key] = data.get(`spec.${f.key}`) === 'on';
      else if (f.kind === 'text' || f.kind === 'driverType') {
        const v = String(data.get(`spec.${f.key}`) ?? '').trim();
        if (v) specs[f.key] = v;
      } else {
        const v = specInput(data.get(`spec.${f.key}`));
        if (v !== undefined) specs[f.key] = v;
      }
    }
    const priceText = String(data.get('price') ?? '').trim();
    const priceMinor = priceText ? parseMoney(priceText, currency) : null;
    if (priceText && priceMinor === null) {
      return form.fail('Check the price.', {
        priceMinor: [`an amount like ${formatMoney(150, currency).replace(/[^\d.,]/g, '')} (${currency})`],
      });
    }
    const body: Record<string, unknown> = {
      sku: String(data.get('sku') ?? ''),
      name: String(data.get('name') ?? ''),
      category,
      tracking,
      specs,
      sellable,
      lendable: data.get('lendable') === 'on',
      priceMinor,
      // Labelled units are always whole items; counted parts may be counted in metres or grams.
      saleUnit: tracking === 'unit' ? 'each' : String(data.get('saleUnit') ?? 'each') || 'each',
      reorderPoint: Number(data.get('reorderPoint') || 0),
      notes: String(data.get('notes') ?? ''),
    };
    if (!partId && tracking === 'unit') {
      body.units = Number(data.get('units') || 0);
      body.locationId = String(data.get('locationId') ?? '') || null;
    }
    const saved = await form.run(
      () =>
        api<{ id: string }>(partId ? `/api/parts/${partId}` : '/api/parts', {
          method: partId ? 'PATCH' : 'POST',
          body,
        }),
      () => 'Saved. Opening the part…',
    );
    if (!saved) return;
    router.push(`/shelf/parts/${saved.id}`);
    router.refresh();
  }

  const shown = [
    'sku',
    'name',
    'category',
    'tracking',
    'reorderPoint',
    'priceMinor',
    'saleUnit',
    'notes',
    'units',
    'locationId',
    ...specFields.map((f) => `specs.${f.key}`),
  ];
  const step = `0.${'0'.repeat(Math.max(0, minorUnitExponent(currency) - 1))}1`;

  return (
    <form onSubmit={onSubmit} className="space-y-5" noValidate>
      <FormMessage message={form.message} fields={form.fields} shown={shown} />
      <div className="card grid gap-4 sm:grid-cols-2">
        <Field
          id="sku"
          label="SKU"
          error={err('sku')}
          hint="Your own stock number: letters, digits and . _ / -"
        >
          <input
            id="sku"
            name="sku"
            className="field font-mono"
            defaultValue={initial.sku}
            required
            {...describedBy('sku', err('sku'), 'hint')}
          />
        </Field>
        <Field id="name" label="Name" error={err('name')}>
          <input
            id="name"
            name="name"
            className="field"
            defaultValue={initial.name}
            required
            {...describedBy('name', err('name'))}
          />
        </Field>
        <Field id="category" label="Category" error={err('category')}>
          <select
            id="category"
            className="field"
            value={category}
            onChange={(e) => setCategory(e.target.value as PartCategory)}
          >
            {CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {CATEGORY_WORDS[c]}
              </option>
            ))}
          </select>
        </Field>
        <fieldset>
          <legend className="label">Tracked as</legend>
          <div className="flex flex-wrap gap-4">
            {(['unit', 'counted'] as const).map((t) => (
              <label key={t} className="flex min-h-11 items-center gap-2">
                <input
                  type="radio"
                  name="tracking"
                  value={t}
                  checked={tracking === t}
                  onChange={() => setTracking(t)}
                  className="size-5"
                />
                {t === 'unit' ? 'Labelled units (each has its own code)' : 'Counted (quantity per bin)'}
              </label>
            ))}
          </div>
          {err('tracking') ? (
            <p className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300">{err('tracking')}</p>
          ) : null}
        </fieldset>
      </div>

      <fieldset className="card">
        <legend className="px-1 font-bold">Electrical specs</legend>
        {specFields.length === 0 ? (
          <p className="muted text-sm">This category has no electrical specs to check.</p>
        ) : (
          <div className="grid gap-4 sm:grid-cols-3">
            {specFields.map((f) => {
              const id = `spec-${f.key}`;
              const e = err(`specs.${f.key}`);
              const value = initial.specs[f.key];
              const label = f.unit ? `${f.label} (${f.unit})` : f.label;
              if (f.kind === 'bool') {
                return (
                  <label key={f.key} className="flex min-h-11 items-center gap-2 self-end">
                    <input
                      type="checkbox"
                      name={`spec.${f.key}`}
                      defaultChecked={value === true}
                      className="size-5"
                    />
                    {f.label}
                  </label>
                );
              }
              if (f.kind === 'driverType') {
                return (
                  <Field key={f.key} id={id} label={label} error={e}>
                    <select
                      id={id}
                      name={`spec.${f.key}`}
                      className="field"
                      value={driverType}
                      onChange={(e) => setDriverType(e.target.value)}
                    >
                      <option value="buck">Buck (switching)</option>
                      <option value="linear">Linear</option>
                      <option value="resistor">Series resistor</option>
                    </select>
                  </Field>
                );
              }
              return (
                <Field key={f.key} id={id} label={label} error={e}>
                  <input
                    id={id}
                    name={`spec.${f.key}`}
                    className="field"
                    inputMode={f.kind === 'text' ? 'text' : 'decimal'}
                    defaultValue={value === undefined ? '' : String(value)}
                    {...describedBy(id, e)}
                  />
                </Field>
              );
            })}
          </div>
        )}
      </fieldset>

      <div className="card grid gap-4 sm:grid-cols-3">
        <Field
          id="reorderPoint"
          label="Reorder point"
          error={err('reorderPoint')}
          hint="Warn when fewer than this are on hand (0 = never)"
        >
          <input
            id="reorderPoint"
            name="reorderPoint"
            type="number"
            min={0}
            step={1}
            className="field"
            defaultValue={initial.reorderPoint}
            {...describedBy('reorderPoint', err('reorderPoint'), 'hint')}
          />
        </Field>
        {tracking === 'counted' ? (
          <Field id="saleUnit" label="Counted and sold in" error={err('saleUnit')}>
            <select id="saleUnit" name="saleUnit" className="field" defaultValue={initial.saleUnit}>
              {MEASURES.map((m) => (
                <option key={m} value={m}>
                  {MEASURE_CHOICES[m]}
                </option>
              ))}
            </select>
          </Field>
        ) : null}
        <label className="flex min-h-11 items-center gap-2 self-end">
          <input type="checkbox" name="lendable" defaultChecked={initial.lendable} className="size-5" /> Can
          be lent
        </label>
        <label className="flex min-h-11 items-center gap-2 self-end">
          <input
            type="checkbox"
            checked={sellable}
            onChange={(e) => setSellable(e.target.checked)}
            className="size-5"
          />{' '}
          Sold at the counter
        </label>
        {sellable ? (
          <>
            <Field id="price" label={`Price (${currency})`} error={err('priceMinor')}>
              <input
                id="price"
                name="price"
                className="field"
                inputMode="decimal"
                placeholder={step}
                defaultValue={
                  initial.priceMinor === null
                    ? ''
                    : (initial.priceMinor / 10 ** minorUnitExponent(currency)).toFixed(
                        minorUnitExponent(currency),
                      )
                }
                {...describedBy('price', err('priceMinor'))}
              />
            </Field>
          </>
        ) : null}
        <div className="sm:col-span-3">
          <Field id="notes" label="Notes" error={err('notes')}>
            <textarea id="notes" name="notes" rows={2} className="field" defaultValue={initial.notes} />
          </Field>
        </div>
      </div>

      {!partId && tracking === 'unit' ? (
        <div className="card grid gap-4 sm:grid-cols-2">
          <Field
            id="units"
            label="Units to label now"
            error={err('units')}
            hint="Each gets its own code; print their labels from the part page"
          >
            <input
              id="units"
              name="units"
              type="number"
              min={0}
              max={500}
              className="field"
              defaultValue={1}
              {...describedBy('units', err('units'), 'hint')}
            />
          </Field>
          <Field id="locationId" label="Put them in" error={err('locationId')}>
            <select id="locationId" name="locationId" className="field" defaultValue={locations[0]?.id ?? ''}>
              <option value="">No bin yet</option>
              {locations.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.name}
                </option>
              ))}
            </select>
          </Field>
        </div>
      ) : null}

      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? 'Saving…' : partId ? 'Save changes' : 'Add part'}
        </button>
        <button type="button" className="btn-quiet" onClick={() => router.back()}>
          Cancel
        </button>
      </div>
    </form>
  );
}
