'use client';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import {
  PRESENCE,
  PRESENCE_NAMES,
  WEEKDAY_NAMES,
  WEEKDAYS,
  type BorrowingRules,
  type Opening,
  type Week,
  type Weekday,
} from '@/lib/rules/schema';
import { FormNote } from '@/components/people/form-field';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';
import { CATEGORIES, CATEGORY_WORDS } from '@/lib/inventory/words';
import { ApiError, errorText, sendJson } from '@/components/people/send-json';

// Who may borrow and when things fall due: the space's standing rule, how things change hands, the
// reminder pause and the opening calendar. The server validates every field again and names any it refuses.

const DEFAULT_HOURS: Opening = { opens: '10:00', closes: '20:00' };
const startWeek = (closingTime: string): Week =>
  Object.fromEntries(WEEKDAYS.map((d) => [d, { opens: '10:00', closes: closingTime }])) as Week;

const amountText = (minor: number | null, currency: string) =>
  minor === null ? '' : (minor / 10 ** minorUnitExponent(currency)).toFixed(minorUnitExponent(currency));

export function BorrowingRulesForm({
  initial,
  closingTime,
  currency,
}: {
  initial: BorrowingRules;
  closingTime: string;
  currency: string;
}) {
  const router = useRouter();
  const ids = useId();
  const [rules, setRules] = useState<BorrowingRules>(initial);
  const [newDate, setNewDate] = useState('');
  const [owingText, setOwingText] = useState(amountText(initial.refuseWhenOwingOverMinor, currency));
  const [lateDayText, setLateDayText] = useState(amountText(initial.lateFee?.perOpeningDayMinor ?? null, currency));
  const [lateCapText, setLateCapText] = useState(amountText(initial.lateFee?.capMinor ?? null, currency));
  const depositTexts = (r: BorrowingRules) =>
    Object.fromEntries(CATEGORIES.map((c) => [c, amountText(r.categoryDepositsMinor[c] ?? null, currency)]));
  const [catDeposits, setCatDeposits] = useState<Record<string, string>>(depositTexts(initial));
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [note, setNote] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  const set = <K extends keyof BorrowingRules>(k: K, v: BorrowingRules[K]) => setRules((r) => ({ ...r, [k]: v }));
  const setDay = (d: Weekday, v: Opening | null) => setRules((r) => ({ ...r, week: { ...(r.week ?? startWeek(closingTime)), [d]: v } }));
  const fieldError = (prefix: string) =>
    Object.entries(fields)
      .filter(([k]) => k === prefix || k.startsWith(`${prefix}.`))
      .flatMap(([, m]) => m)
      .join('; ') || undefined;

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setSaving(true);
    setNote(null);
    setFields({});
    try {
      const owing = owingText.trim() === '' ? null : parseMoney(owingText, currency);
      if (owing === null && owingText.trim() !== '') {
        setFields({ refuseWhenOwingOverMinor: [`an amount in ${currency}, e.g. ${amountText(2000, currency)}`] });
        setNote({ kind: 'error', text: 'Check the amount a member may owe.' });
        return;
      }
      // Late fee: both amounts, or neither (off).
      const lateOff = lateDayText.trim() === '' && lateCapText.trim() === '';
      const perDay = lateOff ? null : parseMoney(lateDayText, currency);
      const cap = lateOff ? null : parseMoney(lateCapText, currency);
      if (!lateOff && (perDay === null || cap === null)) {
        setFields({
          ...(perDay === null ? { 'lateFee.perOpeningDayMinor': [`an amount in ${currency}, e.g. ${amountText(100, currency)}`] } : {}),
          ...(cap === null ? { 'lateFee.capMinor': [`an amount in ${currency}, e.g. ${amountText(1000, currency)}`] } : {}),
        });
        setNote({ kind: 'error', text: 'Give both late-fee amounts, or leave both empty for no late fee.' });
        return;
      }
      // Deposits on loose parts: an empty box is no deposit for that category.
      const categoryDepositsMinor: Record<string, number> = {};
      const badDeposits: Record<string, string[]> = {};
      for (const c of CATEGORIES) {
        const text = (catDeposits[c] ?? '').trim();
        if (!text) continue;
        const v = parseMoney(text, currency);
        if (v === null || v <= 0) badDeposits[`categoryDepositsMinor.${c}`] = [`an amount in ${currency}, e.g. ${amountText(2000, currency)}`];
        else categoryDepositsMinor[c] = v;
      }
      if (Object.keys(badDeposits).length) {
        setFields(badDeposits);
        setNote({ kind: 'error', text: 'Check the deposits on loose parts.' });
        return;
      }
      const { rules: saved } = await sendJson<{ rules: BorrowingRules }>('/api/settings/borrowing', 'PATCH', {
        ...rules,
        categoryDepositsMinor,
        refuseWhenOwingOverMinor: owing,
        lateFee: perDay !== null && cap !== null ? { perOpeningDayMinor: perDay, capMinor: cap } : null,
      });
      setOwingText(amountText(saved.refuseWhenOwingOverMinor, currency));
      setLateDayText(amountText(saved.lateFee?.perOpeningDayMinor ?? null, currency));
      setLateCapText(amountText(saved.lateFee?.capMinor ?? null, currency));
      setCatDeposits(depositTexts(saved));
      setRules(saved);
      setNote({ kind: 'ok', text: 'Borrowing rules saved.' });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
      setNote({ kind: 'error', text: errorText(err) });
    } finally {
      setSaving(false);
    }
  }

  return (
    <form onSubmit={save} noValidate className="space-y-6" aria-label="Borrowing rules">
      <fieldset className="card space-y-4">
        <legend className="px-1 text-lg font-bold">Who may borrow</legend>
        <label className="flex items-start gap-3">
          <input
            type="checkbox"
            className="mt-1 size-5 shrink-0"
            checked={rules.refuseWhileOverdue}
            onChange={(e) => set('refuseWhileOverdue', e.target.checked)}
          />
          <span>
            No new loan while one of the member’s loans is past its due date.
            <span className="muted block text-sm">They are told which loan, and that bringing it back (or a renewal) clears it.</span>
          </span>
        </label>
        <div className="space-y-1">
          <label className="label" htmlFor={`${ids}-owing`}>
            No new loan while the member owes more than ({currency}; empty: no limit)
          </label>
          <input
            id={`${ids}-owing`}
            inputMode="decimal"
            className="field max-w-40"
            value={owingText}
            onChange={(e) => setOwingText(e.target.value)}
            aria-invalid={fieldError('refuseWhenOwingOverMinor') ? true : undefined}
          />
          <p className="muted text-sm">
            Charges for missing or damaged parts, less what a deposit covered
            {rules.refuseWhenOwingOverMinor !== null ? ` (now ${formatMoney(rules.refuseWhenOwingOverMinor, currency)})` : ''}.
          </p>
          {fieldError('refuseWhenOwingOverMinor') ? (
            <p className="text-sm text-red-800 dark:text-red-300">{fieldError('refuseWhenOwingOverMinor')}</p>
          ) : null}
        </div>
        <div className="space-y-1">
          <p className="label">Late fee ({currency}; both empty: no late fee)</p>
          <div className="flex flex-wrap gap-3">
            <label className="space-y-1">
              <span className="block text-sm">Per opening day late</span>
              <input
                inputMode="decimal"
                className="field max-w-32"
                value={lateDayText}
                onChange={(e) => setLateDayText(e.target.value)}
                aria-invalid={fieldError('lateFee.perOpeningDayMinor') ? true : undefined}
              />
            </label>
            <label className="space-y-1">
              <span className="block text-sm">Never more than</span>
              <input
                inputMode="decimal"
                className="field max-w-32"
                value={lateCapText}
                onChange={(e) => setLateCapText(e.target.value)}
                aria-invalid={fieldError('lateFee.capMinor') ? true : undefined}
              />
            </label>
          </div>
          <p className="muted text-sm">
            Charged once when a late return is checked in: only the days the space was open count.
          </p>
          {fieldError('lateFee') ? <p className="text-sm text-red-800 dark:text-red-300">{fieldError('lateFee')}</p> : null}
        </div>
        <details className="space-y-2">
          <summary className="label cursor-pointer">Deposits on loose parts ({currency}; empty: none)</summary>
          <p className="muted text-sm">
            Taken by card when a loose borrow includes parts of the category (once per category). A kit box’s deposit is
            set on its kit.
          </p>
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
            {CATEGORIES.map((c) => (
              <label key={c} className="space-y-1">
                <span className="block text-sm">{CATEGORY_WORDS[c]}</span>
                <input
                  inputMode="decimal"
                  className="field w-full"
                  value={catDeposits[c] ?? ''}
                  onChange={(e) => setCatDeposits((d) => ({ ...d, [c]: e.target.value }))}
                  aria-invalid={fieldError(`categoryDepositsMinor.${c}`) ? true : undefined}
                />
              </label>
            ))}
          </div>
          {fieldError('categoryDepositsMinor') ? (
            <p className="text-sm text-red-800 dark:text-red-300">{fieldError('categoryDepositsMinor')}</p>
          ) : null}
        </details>
        <div role="radiogroup" aria-labelledby={`${ids}-presence`} className="space-y-2">
          <p id={`${ids}-presence`} className="label">
            How things change hands
          </p>
          {PRESENCE.map((p) => (
            <label key={p} className="flex items-start gap-3">
              <input
                type="radio"
                name="presence"
                className="mt-1 size-5 shrink-0"
                checked={rules.presence === p}
                onChange={() => set('presence', p)}
              />
              <span>{PRESENCE_NAMES[p]}</span>
            </label>
          ))}
          {fieldError('presence') ? <p className="text-sm text-red-800 dark:text-red-300">{fieldError('presence')}</p> : null}
        </div>
      </fieldset>

      <fieldset className="card space-y-2">
        <legend className="px-1 text-lg font-bold">Reminders</legend>
        <label className="label" htmlFor={`${ids}-pause`}>
          Leave a member alone after a reminder for (hours)
        </label>
        <input
          id={`${ids}-pause`}
          type="number"
          min={1}
          max={336}
          step={1}
          className="field max-w-40"
          value={Number.isNaN(rules.reminderPauseHours) ? '' : rules.reminderPauseHours}
          onChange={(e) => set('reminderPauseHours', e.target.valueAsNumber)}
          aria-invalid={fieldError('reminderPauseHours') ? true : undefined}
        />
        <p className="muted text-sm">Counts reminders of any of their loans, sent by hand or by the daily run.</p>
        {fieldError('reminderPauseHours') ? (
          <p className="text-sm text-red-800 dark:text-red-300">{fieldError('reminderPauseHours')}</p>
        ) : null}
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-bold">Opening days</legend>
        <label className="flex items-start gap-3">
          <input
            type="checkbox"
            className="mt-1 size-5 shrink-0"
            checked={rules.week !== null}
            onChange={(e) => set('week', e.target.checked ? startWeek(closingTime) : null)}
          />
          <span>
            Keep opening hours per weekday.
            <span className="muted block text-sm">
              Without them, every day closes at {closingTime}. Loans fall due at closing time on the next day the space opens.
            </span>
          </span>
        </label>
        {rules.week ? (
          <ul className="divide-y divide-stone-200 dark:divide-stone-800">
            {WEEKDAYS.map((d) => {
              const day = rules.week![d];
              return (
                <li key={d} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2">
                  <label className="flex w-36 items-center gap-2 font-semibold">
                    <input
                      type="checkbox"
                      className="size-5"
                      checked={day !== null}
                      onChange={(e) => setDay(d, e.target.checked ? DEFAULT_HOURS : null)}
                    />
                    {WEEKDAY_NAMES[d]}
                  </label>
                  {day ? (
                    <span className="flex items-center gap-2">
                      <input
                        type="time"
                        aria-label={`${WEEKDAY_NAMES[d]} opens`}
                        className="field w-28"
                        value={day.opens}
                        onChange={(e) => setDay(d, { ...day, opens: e.target.value })}
                      />
                      <span aria-hidden="true">to</span>
                      <input
                        type="time"
                        aria-label={`${WEEKDAY_NAMES[d]} closes`}
                        className="field w-28"
                        value={day.closes}
                        onChange={(e) => setDay(d, { ...day, closes: e.target.value })}
                      />
                    </span>
                  ) : (
                    <span className="muted">shut</span>
                  )}
                  {fieldError(`week.${d}`) ? (
                    <p className="w-full text-sm text-red-800 dark:text-red-300">{fieldError(`week.${d}`)}</p>
                  ) : null}
                </li>
              );
            })}
          </ul>
        ) : null}

        <div>
          <label className="label" htmlFor={`${ids}-closed`}>
            Closed dates (holidays)
          </label>
          <div className="flex flex-wrap gap-2">
            <input
              id={`${ids}-closed`}
              type="date"
              className="field w-44"
              value={newDate}
              onChange={(e) => setNewDate(e.target.value)}
            />
            <button
              type="button"
              className="btn-quiet"
              disabled={!newDate}
              onClick={() => {
                set('closedDates', [...new Set([...rules.closedDates, newDate])].sort());
                setNewDate('');
              }}
            >
              Add the date
            </button>
          </div>
          {fieldError('closedDates') ? (
            <p className="text-sm text-red-800 dark:text-red-300">{fieldError('closedDates')}</p>
          ) : null}
          {rules.closedDates.length ? (
            <ul className="mt-2 flex flex-wrap gap-2" aria-label="Closed dates">
              {rules.closedDates.map((d) => (
                <li key={d} className="flex items-center gap-1 rounded-full border border-stone-300 px-3 py-1 dark:border-stone-700">
                  <span>{d}</span>
                  <button
                    type="button"
                    className="px-1 font-bold"
                    aria-label={`Open again on ${d}`}
                    onClick={() => set('closedDates', rules.closedDates.filter((x) => x !== d))}
                  >
                    ×
                  </button>
                </li>
              ))}
            </ul>
          ) : (
            <p className="muted mt-1 text-sm">None.</p>
          )}
        </div>
      </fieldset>

      {note ? <FormNote kind={note.kind}>{note.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={saving}>
        {saving ? 'Saving…' : 'Save borrowing rules'}
      </button>
    </form>
  );
}
