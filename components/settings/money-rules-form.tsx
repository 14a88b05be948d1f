'use client';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import type { PartCategory } from '@/lib/domain';
import { CATEGORIES, CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';
import { TAX_MODES, TAX_MODE_WORDS, type MoneyRules } from '@/lib/money-rules/schema';
import { FormNote } from '@/components/people/form-field';
import { ApiError, errorText, sendJson } from '@/components/people/send-json';

// Tax, the smallest card payment and the account codes for the month's export. A rate is typed as a
// percent ("8.25") and sent as hundredths of a percent (825); amounts as money, sent in minor units.

const percentText = (bp: number) => String(bp / 100);
const percentToBp = (s: string): number | null => {
  const t = s.trim().replace(',', '.');
  if (!/^\d{1,3}(\.\d{1,2})?$/.test(t)) return null;
  return Math.round(Number(t) * 100);
};
const plainAmount = (minor: number, currency: string) => {
  const exp = minorUnitExponent(currency);
  return (minor / 10 ** exp).toFixed(exp);
};

export function MoneyRulesForm({ initial, currency }: { initial: MoneyRules; currency: string }) {
  const router = useRouter();
  const ids = useId();
  const [rules, setRules] = useState<MoneyRules>(initial);
  const [rate, setRate] = useState(percentText(initial.taxRateBp));
  const [minCard, setMinCard] = useState(plainAmount(initial.minCardMinor, currency));
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [note, setNote] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  const err = (k: string) => fields[k]?.join('; ');

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setNote(null);
    const taxRateBp = percentToBp(rate);
    const minCardMinor = parseMoney(minCard, currency);
    const local: Record<string, string[]> = {};
    if (taxRateBp === null || taxRateBp > 10_000) local.taxRateBp = ['a percentage from 0 to 100, up to two decimals, e.g. 8.25'];
    if (minCardMinor === null) local.minCardMinor = ['an amount such as 1.00 (0 for any amount)'];
    setFields(local);
    if (Object.keys(local).length) return;
    setSaving(true);
    try {
      const accountCodes = Object.fromEntries(CATEGORIES.map((c) => [c, rules.accountCodes[c] ?? '']));
      const { rules: saved } = await sendJson<{ rules: MoneyRules }>('/api/settings/money', 'PATCH', {
        ...rules,
        taxRateBp,
        minCardMinor,
        accountCodes,
      });
      setRules(saved);
      setNote({ kind: 'ok', text: 'Money rules saved. Sales already made keep the tax they were made under.' });
      router.refresh();
    } catch (e2) {
      if (e2 instanceof ApiError) setFields(e2.fields);
      setNote({ kind: 'error', text: errorText(e2) });
    } finally {
      setSaving(false);
    }
  }

  return (
    <form onSubmit={save} noValidate className="space-y-6" aria-label="Money rules">
      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-bold">Tax</legend>
        <div role="radiogroup" aria-labelledby={`${ids}-mode`} className="space-y-2">
          <p id={`${ids}-mode`} className="label">
            How shelf prices carry tax
          </p>
          {TAX_MODES.map((m) => (
            <label key={m} className="flex items-start gap-3">
              <input
                type="radio"
                name={`${ids}-mode`}
                className="mt-1 size-5 shrink-0"
                checked={rules.taxMode === m}
                onChange={() => setRules((r) => ({ ...r, taxMode: m }))}
              />
              <span>{TAX_MODE_WORDS[m]}</span>
            </label>
          ))}
        </div>
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label htmlFor={`${ids}-rate`} className="label">
              Rate (%)
            </label>
            <input id={`${ids}-rate`} className="field" inputMode="decimal" value={rate} onChange={(e) => setRate(e.target.value)} aria-invalid={Boolean(err('taxRateBp')) || undefined} />
            {err('taxRateBp') ? <p className="text-sm text-red-800 dark:text-red-300">{err('taxRateBp')}</p> : null}
          </div>
          <div>
            <label htmlFor={`${ids}-name`} className="label">
              Name on receipts
            </label>
            <input id={`${ids}-name`} className="field" value={rules.taxName} onChange={(e) => setRules((r) => ({ ...r, taxName: e.target.value }))} aria-invalid={Boolean(err('taxName')) || undefined} />
            {err('taxName') ? <p className="text-sm text-red-800 dark:text-red-300">{err('taxName')}</p> : null}
          </div>
        </div>
        <p className="muted text-sm">
          Tax is worked out once per sale on its total and rounded half away from zero to the smallest coin. Changing the
          rate changes only sales made from now on.
        </p>
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-bold">Card payments</legend>
        <div>
          <label htmlFor={`${ids}-min`} className="label">
            Smallest card payment ({currency})
          </label>
          <input id={`${ids}-min`} className="field" inputMode="decimal" value={minCard} onChange={(e) => setMinCard(e.target.value)} aria-describedby={`${ids}-min-help`} aria-invalid={Boolean(err('minCardMinor')) || undefined} />
          {err('minCardMinor') ? <p className="text-sm text-red-800 dark:text-red-300">{err('minCardMinor')}</p> : null}
          <p id={`${ids}-min-help`} className="muted text-sm">
            Below it the counter offers cash only and says why: on a small sale the card fees eat most of the money. 0 takes
            cards for any amount{rules.minCardMinor ? `; now ${formatMoney(rules.minCardMinor, currency)}` : ''}.
          </p>
        </div>
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-bold">Account codes for the month’s export</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          {CATEGORIES.map((c: PartCategory) => (
            <div key={c}>
              <label htmlFor={`${ids}-code-${c}`} className="label">
                {CATEGORY_WORDS[c]}
              </label>
              <input
                id={`${ids}-code-${c}`}
                className="field font-mono"
                value={rules.accountCodes[c] ?? ''}
                onChange={(e) => setRules((r) => ({ ...r, accountCodes: { ...r.accountCodes, [c]: e.target.value } }))}
                aria-invalid={Boolean(err(`accountCodes.${c}`)) || undefined}
              />
              {err(`accountCodes.${c}`) ? <p className="text-sm text-red-800 dark:text-red-300">{err(`accountCodes.${c}`)}</p> : null}
            </div>
          ))}
        </div>
      </fieldset>

      {note ? <FormNote kind={note.kind}>{note.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={saving}>
        {saving ? 'Saving…' : 'Save money rules'}
      </button>
    </form>
  );
}
