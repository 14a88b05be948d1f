'use client';
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, type FieldErrors } from 'react-hook-form';
import { LAYOUTS } from '@/labels/layouts';
import {
  AMBIENT_MAX_C,
  AMBIENT_MIN_C,
  settingsSchema,
  type Settings,
  type SettingsFormInput,
} from '@/lib/settings/schema';
import { describedBy, FormField, FormNote } from '@/components/people/form-field';
import { applyFieldErrors, errorText, sendJson } from '@/components/people/send-json';

const FIELDS = Object.keys(settingsSchema.shape) as (keyof Settings)[];

type NumberField = 'loanDays' | 'maxOpenLoans' | 'reminderDaysBefore' | 'reminderEveryDays';
const NUMBERS: { name: NumberField; label: string; hint: string; min: number; max: number }[] = [
  {
    name: 'loanDays',
    label: 'Loan period (days)',
    hint: 'A loan is due at closing time this many days after it goes out.',
    min: 1,
    max: 365,
  },
  {
    name: 'maxOpenLoans',
    label: 'Open loans per member',
    hint: 'How many loans one member may have out at once.',
    min: 1,
    max: 100,
  },
  {
    name: 'reminderDaysBefore',
    label: 'First reminder (days before due)',
    hint: '0 sends no reminder before the due day.',
    min: 0,
    max: 30,
  },
  {
    name: 'reminderEveryDays',
    label: 'While overdue, remind every (days)',
    hint: 'Repeats until the loan comes back.',
    min: 1,
    max: 30,
  },
];

/**
 * The space's rules, checked field by field in the browser and again on the server. The lists of time zones
 * and currencies come from the server as props: the browser's Intl knows a different set than Node's, and a
 * list computed on both sides rendered differently (a hydration error on every load).
 */
export function SettingsForm({
  initial,
  timeZones,
  currencies,
}: {
  initial: Settings;
  timeZones: readonly string[];
  currencies: readonly string[];
}) {
  const router = useRouter();
  const [note, setNote] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<SettingsFormInput, unknown, Settings>({
    resolver: zodResolver(settingsSchema),
    defaultValues: initial,
  });
  const zones = timeZones.includes(initial.timeZone) ? timeZones : [initial.timeZone, ...timeZones];
  // register() alone leaves the server-rendered fields empty until hydration; defaultValue fills them.
  const field = (name: keyof Settings, options?: { valueAsNumber: true }) => ({
    ...register(name, options),
    defaultValue: initial[name],
  });
  const err = (name: keyof Settings) => (errors as FieldErrors<Settings>)[name]?.message;

  const onSubmit = handleSubmit(
    async (values) => {
      setNote(null);
      try {
        const { settings } = await sendJson<{ settings: Settings }>('/api/settings', 'PATCH', values);
        reset(settings);
        setNote({ kind: 'ok', text: 'Settings saved.' });
        router.refresh();
      } catch (e) {
        const unplaced = applyFieldErrors(e, setError, FIELDS);
        setNote({ kind: 'error', text: [errorText(e), ...unplaced].join(' ') });
      }
    },
    () => setNote({ kind: 'error', text: 'Check the highlighted fields.' }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <fieldset className="card grid gap-4 sm:grid-cols-2">
        <legend className="px-1 text-lg font-bold">The space</legend>
        <FormField id="set-name" label="Name" error={err('name')}>
          <input {...field('name')} {...describedBy('set-name', err('name'))} className="field" />
        </FormField>
        <FormField
          id="set-timeZone"
          label="Time zone"
          error={err('timeZone')}
          hint="Due dates and closing time are in this zone."
        >
          <select
            {...field('timeZone')}
            {...describedBy('set-timeZone', err('timeZone'), true)}
            className="field"
          >
            {zones.map((z) => (
              <option key={z} value={z}>
                {z}
              </option>
            ))}
          </select>
        </FormField>
        <FormField
          id="set-closingTime"
          label="Closing time (HH:MM)"
          error={err('closingTime')}
          hint="Loans fall due at this time."
        >
          <input
            {...field('closingTime')}
            {...describedBy('set-closingTime', err('closingTime'), true)}
            className="field"
            inputMode="numeric"
            placeholder="20:00"
          />
        </FormField>
        <FormField
          id="set-currency"
          label="Currency (ISO 4217 code)"
          error={err('currency')}
          hint="Three letters, e.g. USD or EUR. Fixed once the space has sales."
        >
          <input
            {...field('currency')}
            {...describedBy('set-currency', err('currency'), true)}
            className="field uppercase"
            maxLength={3}
            list="set-currency-codes"
            autoComplete="off"
          />
          <datalist id="set-currency-codes">
            {currencies.map((c) => (
              <option key={c} value={c} />
            ))}
          </datalist>
        </FormField>
      </fieldset>

      <fieldset className="card grid gap-4 sm:grid-cols-2">
        <legend className="px-1 text-lg font-bold">Loans and reminders</legend>
        {NUMBERS.map((f) => (
          <FormField key={f.name} id={`set-${f.name}`} label={f.label} error={err(f.name)} hint={f.hint}>
            <input
              {...field(f.name, { valueAsNumber: true })}
              {...describedBy(`set-${f.name}`, err(f.name), true)}
              type="number"
              min={f.min}
              max={f.max}
              step={1}
              className="field"
            />
          </FormField>
        ))}
      </fieldset>

      <fieldset className="card">
        <legend className="px-1 text-lg font-bold">The bench</legend>
        <FormField
          id="set-ambientC"
          label="Air temperature at the bench (°C)"
          error={err('ambientC')}
          hint={`Every heat check starts from this; a warm room leaves less room for the LEDs. ${AMBIENT_MIN_C} to ${AMBIENT_MAX_C} °C.`}
        >
          <input
            {...field('ambientC', { valueAsNumber: true })}
            {...describedBy('set-ambientC', err('ambientC'), true)}
            type="number"
            min={AMBIENT_MIN_C}
            max={AMBIENT_MAX_C}
            step={0.5}
            inputMode="decimal"
            className="field"
          />
        </FormField>
      </fieldset>

      <fieldset className="card">
        <legend className="px-1 text-lg font-bold">Labels</legend>
        <FormField
          id="set-labelLayout"
          label="Label layout"
          error={err('labelLayout')}
          hint="Used when printing label sheets."
        >
          <select
            {...field('labelLayout')}
            {...describedBy('set-labelLayout', err('labelLayout'), true)}
            className="field"
          >
            {LAYOUTS.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </FormField>
      </fieldset>

      {note ? <FormNote kind={note.kind}>{note.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={isSubmitting || !isDirty}>
        {isSubmitting ? 'Saving…' : 'Save settings'}
      </button>
    </form>
  );
}
