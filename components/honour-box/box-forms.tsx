'use client';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { ApiError, callApi, errorText, fieldError, type FieldErrors } from '@/components/ui/api';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';

/** Minor units as the plain decimal a person types ("40.00"; yen "4000"). */
const plainAmount = (minor: number, currency: string) => {
  const exp = minorUnitExponent(currency);
  return (minor / 10 ** exp).toFixed(exp);
};

type Latest = { id: string; countedMinor: number; banked: boolean } | null;

// The steward's two steps at the honour box: count it (against what the books expect), then take the
// count to the bank. The server works out the expected amount again and names any field it refuses.
export function BoxForms({ currency, expectedMinor, latest }: { currency: string; expectedMinor: number; latest: Latest }) {
  const router = useRouter();
  const ids = useId();
  const money = (n: number) => formatMoney(n, currency);
  const [counted, setCounted] = useState('');
  const [note, setNote] = useState('');
  const [bankAmount, setBankAmount] = useState(latest ? plainAmount(latest.countedMinor, currency) : '');
  const [reference, setReference] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const [message, setMessage] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  const countedMinor = parseMoney(counted, currency);
  const difference = countedMinor === null ? null : countedMinor - expectedMinor;

  async function send(url: string, body: unknown, done: string) {
    setBusy(true);
    setFields({});
    setMessage(null);
    try {
      await callApi(url, 'POST', body);
      setMessage({ kind: 'ok', text: done });
      setCounted('');
      setNote('');
      setReference('');
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
      setMessage({ kind: 'error', text: errorText(err) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-4">
      <form
        className="card space-y-3"
        aria-labelledby={`${ids}-count`}
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          if (countedMinor === null) {
            setFields({ countedMinor: ['Type the amount you counted, e.g. 12.50.'] });
            return;
          }
          void send('/api/honour-box/counts', { countedMinor, note }, `Count of ${money(countedMinor)} recorded.`);
        }}
      >
        <h2 id={`${ids}-count`} className="text-lg font-bold">
          Count the box
        </h2>
        <div>
          <label htmlFor={`${ids}-counted`} className="label">
            Cash counted ({currency})
          </label>
          <input
            id={`${ids}-counted`}
            className="field"
            inputMode="decimal"
            value={counted}
            onChange={(e) => setCounted(e.target.value)}
            aria-describedby={`${ids}-diff`}
            aria-invalid={Boolean(fieldError(fields, 'countedMinor')) || undefined}
          />
          {fieldError(fields, 'countedMinor') ? <p className="text-sm text-red-800 dark:text-red-300">{fieldError(fields, 'countedMinor')}</p> : null}
          <p id={`${ids}-diff`} className="muted text-sm" data-testid="count-difference">
            {difference === null
              ? `The box should hold ${money(expectedMinor)}.`
              : difference === 0
                ? 'Matches what the box should hold.'
                : `${difference > 0 ? 'Over' : 'Short'} by ${money(Math.abs(difference))}: say why below.`}
          </p>
        </div>
        <div>
          <label htmlFor={`${ids}-note`} className="label">
            What happened (needed when the count differs)
          </label>
          <textarea
            id={`${ids}-note`}
            className="field"
            rows={2}
            value={note}
            onChange={(e) => setNote(e.target.value)}
            aria-invalid={Boolean(fieldError(fields, 'note')) || undefined}
          />
          {fieldError(fields, 'note') ? <p className="text-sm text-red-800 dark:text-red-300">{fieldError(fields, 'note')}</p> : null}
        </div>
        <button type="submit" className="btn-primary w-full" disabled={busy}>
          Record the count
        </button>
      </form>

      {latest && !latest.banked ? (
        <form
          className="card space-y-3"
          aria-labelledby={`${ids}-bank`}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            const amountMinor = parseMoney(bankAmount, currency);
            if (amountMinor === null) {
              setFields({ amountMinor: ['Type the amount taken to the bank, e.g. 40.00.'] });
              return;
            }
            void send(
              '/api/honour-box/bankings',
              { countId: latest.id, amountMinor, reference },
              `${money(amountMinor)} recorded as banked.`,
            );
          }}
        >
          <h2 id={`${ids}-bank`} className="text-lg font-bold">
            Take the last count to the bank
          </h2>
          <p className="muted text-sm">The last count found {money(latest.countedMinor)}. Leave some in the box as change if you like.</p>
          <div>
            <label htmlFor={`${ids}-amount`} className="label">
              Amount banked ({currency})
            </label>
            <input
              id={`${ids}-amount`}
              className="field"
              inputMode="decimal"
              value={bankAmount}
              onChange={(e) => setBankAmount(e.target.value)}
              aria-invalid={Boolean(fieldError(fields, 'amountMinor')) || undefined}
            />
            {fieldError(fields, 'amountMinor') ? <p className="text-sm text-red-800 dark:text-red-300">{fieldError(fields, 'amountMinor')}</p> : null}
          </div>
          <div>
            <label htmlFor={`${ids}-ref`} className="label">
              Deposit reference (optional)
            </label>
            <input id={`${ids}-ref`} className="field" value={reference} onChange={(e) => setReference(e.target.value)} />
          </div>
          <button type="submit" className="btn-primary w-full" disabled={busy}>
            Record the banking
          </button>
        </form>
      ) : null}

      {message ? (
        <p
          role={message.kind === 'error' ? 'alert' : 'status'}
          className={
            message.kind === 'error'
              ? 'rounded-lg border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-200'
              : 'rounded-lg border border-accent bg-accent-soft p-2 text-sm text-stone-900'
          }
        >
          {message.text}
        </p>
      ) : null}
    </div>
  );
}
