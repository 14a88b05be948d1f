'use client';
import { useRouter } from 'next/navigation';
import { callApi } from '@/components/ui/api';
import { useApiForm } from '@/components/shelf/use-api-form';
import { describedBy, Field, FormMessage } from '@/components/shelf/form-bits';
import { minorUnitExponent, parseMoney } from '@/lib/money';

/** An admin sets the monthly restocking budget (blank for none), typed in major units. */
export function BudgetForm({ currency, budgetMinor }: { currency: string; budgetMinor: number | null }) {
  const router = useRouter();
  const form = useApiForm();
  const exp = minorUnitExponent(currency);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const typed = String(new FormData(e.currentTarget).get('budget') ?? '').trim();
    const minor = typed === '' ? null : parseMoney(typed, currency);
    if (typed !== '' && minor === null) return form.fail('Type an amount, like 250.00.', { monthlyBudgetMinor: ['not an amount'] });
    const done = await form.run(
      () => callApi('/api/settings/restocking', 'PATCH', { monthlyBudgetMinor: minor }),
      () => (minor === null ? 'No monthly budget now.' : 'Budget saved.'),
    );
    if (done) router.refresh();
  }
  return (
    <form onSubmit={onSubmit} className="mt-3 flex flex-wrap items-end gap-3" noValidate>
      <Field id="budget" label={`Monthly budget (${currency})`} error={form.err('monthlyBudgetMinor')}>
        <input
          id="budget"
          name="budget"
          inputMode="decimal"
          className="field w-40"
          defaultValue={budgetMinor === null ? '' : (budgetMinor / 10 ** exp).toFixed(exp)}
          {...describedBy('budget', form.err('monthlyBudgetMinor'))}
        />
      </Field>
      <button type="submit" className="btn-quiet" disabled={form.busy}>
        Save budget
      </button>
      <div className="w-full">
        <FormMessage message={form.message} ok={form.ok} fields={form.fields} shown={['monthlyBudgetMinor']} />
      </div>
    </form>
  );
}
