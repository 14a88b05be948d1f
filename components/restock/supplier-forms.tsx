'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { callApi } from '@/components/ui/api';
import { describedBy, Field, FormMessage } from '@/components/shelf/form-bits';
import { PartPicker, type PickedPart } from '@/components/shelf/part-picker';
import { useApiForm } from '@/components/shelf/use-api-form';
import { parseMoney } from '@/lib/money';

/** Adds a supplier: name, contact e-mail, website, lead time, minimum order, notes. */
export function SupplierForm({ currency }: { currency: string }) {
  const router = useRouter();
  const form = useApiForm();
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const el = e.currentTarget;
    const d = new FormData(el);
    const minText = String(d.get('minOrder') ?? '').trim();
    const min = minText ? parseMoney(minText, currency) : 0;
    if (min === null) return form.fail('Type the minimum order like 50.00.', { minOrderMinor: ['not an amount'] });
    const ok = await form.run(
      () =>
        callApi('/api/suppliers', 'POST', {
          name: String(d.get('name') ?? ''),
          email: String(d.get('email') ?? '').trim(),
          website: String(d.get('website') ?? '').trim(),
          leadDays: Number(d.get('leadDays') || 0),
          minOrderMinor: min,
          notes: String(d.get('notes') ?? ''),
        }),
      () => 'Supplier added.',
    );
    if (ok) {
      el.reset();
      router.refresh();
    }
  }
  const f = (name: string) => form.err(name);
  return (
    <form onSubmit={onSubmit} className="card space-y-3" aria-label="Add a supplier" noValidate>
      <h2 className="text-lg font-bold">Add a supplier</h2>
      <FormMessage message={form.message} ok={form.ok} fields={form.fields} shown={['name', 'email', 'website', 'leadDays', 'minOrderMinor', 'notes']} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="s-name" label="Name" error={f('name')}>
          <input id="s-name" name="name" className="field" required {...describedBy('s-name', f('name'))} />
        </Field>
        <Field id="s-email" label="Contact e-mail (order lists go here)" error={f('email')}>
          <input id="s-email" name="email" type="email" className="field" {...describedBy('s-email', f('email'))} />
        </Field>
        <Field id="s-website" label="Website" error={f('website')}>
          <input id="s-website" name="website" type="url" className="field" {...describedBy('s-website', f('website'))} />
        </Field>
        <Field id="s-lead" label="Lead time (days)" error={f('leadDays')}>
          <input id="s-lead" name="leadDays" type="number" min={0} step={1} defaultValue={7} className="field" {...describedBy('s-lead', f('leadDays'))} />
        </Field>
        <Field id="s-min" label={`Minimum order (${currency})`} error={f('minOrderMinor')}>
          <input id="s-min" name="minOrder" inputMode="decimal" className="field" {...describedBy('s-min', f('minOrderMinor'))} />
        </Field>
        <Field id="s-notes" label="Notes" error={f('notes')}>
          <input id="s-notes" name="notes" className="field" />
        </Field>
      </div>
      <button type="submit" className="btn-primary" disabled={form.busy}>
        Add supplier
      </button>
    </form>
  );
}

/** Adds (or replaces) what a supplier offers for a part. */
export function OfferForm({ currency, suppliers }: { currency: string; suppliers: { id: string; name: string }[] }) {
  const router = useRouter();
  const form = useApiForm();
  const [part, setPart] = useState<PickedPart | null>(null);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const d = new FormData(e.currentTarget);
    if (!part) return form.fail('Choose a part first.', { partId: ['choose a part'] });
    const price = parseMoney(String(d.get('price') ?? ''), currency);
    if (price === null) return form.fail('Type the price per pack like 12.50.', { packPriceMinor: ['not an amount'] });
    const ok = await form.run(
      () =>
        callApi('/api/suppliers/offers', 'POST', {
          supplierId: String(d.get('supplierId') ?? ''),
          partId: part.id,
          itemRef: String(d.get('itemRef') ?? ''),
          packSize: Number(d.get('packSize') || 0),
          packPriceMinor: price,
          preferred: d.get('preferred') === 'on',
        }),
      () => 'Offer saved.',
    );
    if (ok) router.refresh();
  }
  const f = (name: string) => form.err(name);
  if (!suppliers.length) return null;
  return (
    <form onSubmit={onSubmit} className="card space-y-3" aria-label="Add an offer" noValidate>
      <h2 className="text-lg font-bold">What a supplier sells us</h2>
      <FormMessage message={form.message} ok={form.ok} fields={form.fields} shown={['supplierId', 'partId', 'itemRef', 'packSize', 'packPriceMinor']} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="o-supplier" label="Supplier" error={f('supplierId')}>
          <select id="o-supplier" name="supplierId" className="field">
            {suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </Field>
        <Field id="o-part" label="Part" error={undefined}>
          <PartPicker id="o-part" value={part} onChange={setPart} error={f('partId')} />
        </Field>
        <Field id="o-ref" label="Their reference" error={f('itemRef')}>
          <input id="o-ref" name="itemRef" className="field" />
        </Field>
        <Field id="o-pack" label="Pack size (items, or metres or grams for parts counted that way)" error={f('packSize')}>
          <input id="o-pack" name="packSize" type="number" min={0.001} step={0.001} inputMode="decimal" defaultValue={1} className="field" {...describedBy('o-pack', f('packSize'))} />
        </Field>
        <Field id="o-price" label={`Price per pack (${currency})`} error={f('packPriceMinor')}>
          <input id="o-price" name="price" inputMode="decimal" className="field" {...describedBy('o-price', f('packPriceMinor'))} />
        </Field>
        <label className="flex min-h-11 items-center gap-2 self-end text-sm">
          <input type="checkbox" name="preferred" /> Order this part from here
        </label>
      </div>
      <button type="submit" className="btn-quiet" disabled={form.busy}>
        Save offer
      </button>
    </form>
  );
}

/** Removes one offer. */
export function RemoveOffer({ offerId, label }: { offerId: string; label: string }) {
  const router = useRouter();
  const form = useApiForm();
  return (
    <button
      type="button"
      className="btn-quiet min-h-11 px-3 py-1 text-sm"
      aria-label={label}
      disabled={form.busy}
      onClick={async () => {
        const ok = await form.run(() => callApi(`/api/suppliers/offers/${offerId}`, 'DELETE'), () => 'Removed.');
        if (ok) router.refresh();
      }}
    >
      Remove
    </button>
  );
}
