'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { callApi } from '@/components/ui/api';
import { CodeText } from '@/components/shelf/code-text';
import { describedBy, Field, FormMessage } from '@/components/shelf/form-bits';
import { PrintLabelsButton } from '@/components/shelf/print-labels-button';
import { useApiForm } from '@/components/shelf/use-api-form';
import type { Measure, OrderState } from '@/lib/domain';
import { formatQty, MEASURE_SYMBOL, qtyInputMode, qtyStep } from '@/lib/inventory/measure';
import { formatMoney, minorUnitExponent, parseMoney } from '@/lib/money';

export type WorkLine = {
  id: string;
  partId: string;
  partName: string;
  tracking: 'counted' | 'unit';
  /** Whole items, metres or grams: what arrives of metres and grams may be a fraction. */
  saleUnit: Measure;
  packSize: number;
  packs: number;
  orderedUnits: number;
  receivedUnits: number;
  packPriceMinor: number;
};

const newKey = () => `rcv-${crypto.randomUUID()}`;

/** The steward's work on one order list: change a draft, send it, receive against it, call it off. */
export function OrderWork({
  orderId,
  state,
  currency,
  lines,
  locations,
  isAdmin,
  labels,
}: {
  orderId: string;
  state: OrderState;
  currency: string;
  lines: WorkLine[];
  locations: { id: string; name: string }[];
  isAdmin: boolean;
  labels: { layouts: { id: string; name: string }[]; defaultLayout: string };
}) {
  const router = useRouter();
  const form = useApiForm();
  // One key per receipt being typed: a double click sends the same key, so it is one receipt.
  const [key, setKey] = useState(newKey);
  const [newCodes, setNewCodes] = useState<string[]>([]);
  const exp = minorUnitExponent(currency);
  const money = (n: number) => formatMoney(n, currency);

  async function saveDraft(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const kept = lines
      .filter((l) => data.get(`drop-${l.id}`) !== 'on')
      .map((l) => ({ partId: l.partId, packs: Number(data.get(`packs-${l.id}`)) }));
    const ok = await form.run(
      () => callApi(`/api/orders/${orderId}`, 'PATCH', { lines: kept, note: String(data.get('note') ?? '') }),
      () => 'Order list saved.',
    );
    if (ok) router.refresh();
  }

  async function send(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const note = String(new FormData(e.currentTarget).get('approvalNote') ?? '').trim();
    const ok = await form.run(
      () => callApi(`/api/orders/${orderId}/send`, 'POST', note ? { approvalNote: note } : {}),
      () => 'Sent to the supplier, with the list attached as a CSV file.',
    );
    if (ok) router.refresh();
  }

  async function receive(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const got: { lineId: string; units: number; receivedBefore: number; locationId: string | null; packPriceMinor?: number }[] = [];
    for (const l of lines) {
      const units = Number(data.get(`units-${l.id}`) || 0);
      if (!units) continue;
      const priceText = String(data.get(`price-${l.id}`) ?? '').trim();
      const price = priceText ? parseMoney(priceText, currency) : null;
      if (priceText && price === null) return form.fail('Type the price paid like 12.50.', { [`price-${l.id}`]: ['not an amount'] });
      got.push({
        lineId: l.id,
        units,
        receivedBefore: l.receivedUnits,
        locationId: String(data.get(`bin-${l.id}`) || '') || null,
        ...(price !== null && price !== l.packPriceMinor ? { packPriceMinor: price } : {}),
      });
    }
    const finish = data.get('finish') === 'on';
    const r = await form.run(
      () =>
        callApi<{ unitCodes: string[]; costMinor: number; state: string }>(`/api/orders/${orderId}/receive`, 'POST', {
          idempotencyKey: key,
          lines: got,
          finish,
        }),
      (x) => `Received, ${money(x.costMinor)} at the price paid.${x.unitCodes.length ? ' Print the new labels below.' : ''}`,
    );
    if (r) {
      setNewCodes(r.unitCodes);
      setKey(newKey());
      router.refresh();
    }
  }

  async function cancel(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const note = String(new FormData(e.currentTarget).get('cancelNote') ?? '');
    const ok = await form.run(
      () => callApi(`/api/orders/${orderId}/cancel`, 'POST', { note }),
      () => 'Called off. What already arrived stays on the shelf.',
    );
    if (ok) router.refresh();
  }

  async function approve(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const note = String(new FormData(e.currentTarget).get('approveNote') ?? '');
    const ok = await form.run(() => callApi(`/api/orders/${orderId}/approve`, 'POST', { note }), () => 'Approved past the budget.');
    if (ok) router.refresh();
  }

  const open = state === 'sent' || state === 'part_in';
  return (
    <div className="space-y-4">
      <FormMessage message={form.message} ok={form.ok} fields={form.fields} shown={[]} />

      {state === 'draft' ? (
        <form onSubmit={saveDraft} className="card space-y-3" aria-label="Change the list" noValidate>
          <h2 className="text-lg font-bold">Change the list</h2>
          <ul className="space-y-3">
            {lines.map((l, i) => (
              <li key={l.id} className="flex flex-wrap items-end gap-3">
                <Field id={`packs-${l.id}`} label={`${l.partName} — packs of ${formatQty(l.packSize, l.saleUnit)}`} error={form.err(`lines.${i}.packs`)}>
                  <input
                    id={`packs-${l.id}`}
                    name={`packs-${l.id}`}
                    type="number"
                    min={1}
                    step={1}
                    defaultValue={l.packs}
                    className="field w-28"
                    {...describedBy(`packs-${l.id}`, form.err(`lines.${i}.packs`))}
                  />
                </Field>
                <label className="flex min-h-11 items-center gap-2 text-sm">
                  <input type="checkbox" name={`drop-${l.id}`} /> Drop this line
                </label>
              </li>
            ))}
          </ul>
          <Field id="note" label="Note to the supplier (optional)" error={form.err('note')}>
            <input id="note" name="note" className="field" />
          </Field>
          <button type="submit" className="btn-quiet" disabled={form.busy}>
            Save changes
          </button>
        </form>
      ) : null}

      {state === 'draft' ? (
        <form onSubmit={send} className="card space-y-3" aria-label="Send" noValidate>
          <h2 className="text-lg font-bold">Send to the supplier</h2>
          <p className="text-sm">An e-mail goes to the supplier’s contact address with the list attached as a CSV file.</p>
          {isAdmin ? (
            <Field id="approvalNote" label="Approval note, if this passes the month’s budget" error={form.err('approvalNote')}>
              <input id="approvalNote" name="approvalNote" className="field" {...describedBy('approvalNote', form.err('approvalNote'))} />
            </Field>
          ) : null}
          <button type="submit" className="btn-primary" disabled={form.busy} data-primary>
            {form.busy ? 'Sending…' : 'Send the order list'}
          </button>
        </form>
      ) : null}

      {state === 'draft' && isAdmin ? (
        <form onSubmit={approve} className="card space-y-3" aria-label="Approve past the budget" noValidate>
          <h2 className="text-lg font-bold">Approve past the budget</h2>
          <Field id="approveNote" label="Why (a steward may then send it)" error={form.err('note')}>
            <input id="approveNote" name="approveNote" className="field" />
          </Field>
          <button type="submit" className="btn-quiet" disabled={form.busy}>
            Approve
          </button>
        </form>
      ) : null}

      {open ? (
        <form onSubmit={receive} className="card space-y-3" aria-label="Receive" noValidate>
          <h2 className="text-lg font-bold">What arrived</h2>
          <p className="text-sm">Enter what is in the box now; leave a line at 0 if none of it came. A different price per pack is kept as paid.</p>
          <ul className="space-y-4">
            {lines.map((l, i) => (
              <li key={l.id} className="space-y-2">
                <p className="font-semibold break-words">
                  {l.partName}{' '}
                  <span className="muted text-sm font-normal">
                    {formatQty(l.receivedUnits, l.saleUnit)} of {formatQty(l.orderedUnits, l.saleUnit)} arrived so far
                  </span>
                </p>
                <div className="grid gap-3 sm:grid-cols-3">
                  <Field id={`units-${l.id}`} label={
                      l.tracking === 'unit'
                        ? 'Units (each gets a label)'
                        : l.saleUnit === 'metre'
                          ? `Metres (${MEASURE_SYMBOL.metre})`
                          : l.saleUnit === 'gram'
                            ? `Grams (${MEASURE_SYMBOL.gram})`
                            : 'Units'
                    } error={form.err(`lines.${i}.units`) ?? form.err(`lines.${i}.receivedBefore`)}>
                    <input
                      id={`units-${l.id}`}
                      name={`units-${l.id}`}
                      type="number"
                      min={0}
                      step={qtyStep(l.saleUnit)}
                      inputMode={qtyInputMode(l.saleUnit)}
                      defaultValue={0}
                      className="field"
                      {...describedBy(`units-${l.id}`, form.err(`lines.${i}.units`) ?? form.err(`lines.${i}.receivedBefore`))}
                    />
                  </Field>
                  <Field id={`price-${l.id}`} label="Price paid per pack" error={form.err(`price-${l.id}`) ?? form.err(`lines.${i}.packPriceMinor`)}>
                    <input
                      id={`price-${l.id}`}
                      name={`price-${l.id}`}
                      inputMode="decimal"
                      className="field"
                      defaultValue={(l.packPriceMinor / 10 ** exp).toFixed(exp)}
                    />
                  </Field>
                  <Field id={`bin-${l.id}`} label="Into bin" error={form.err('locationId')}>
                    <select id={`bin-${l.id}`} name={`bin-${l.id}`} className="field">
                      {l.tracking === 'unit' ? <option value="">No bin yet</option> : null}
                      {locations.map((b) => (
                        <option key={b.id} value={b.id}>
                          {b.name}
                        </option>
                      ))}
                    </select>
                  </Field>
                </div>
              </li>
            ))}
          </ul>
          <label className="flex min-h-11 items-center gap-2 text-sm">
            <input type="checkbox" name="finish" /> Nothing more is coming on this list
          </label>
          <button type="submit" className="btn-primary" disabled={form.busy} data-primary>
            {form.busy ? 'Receiving…' : 'Receive'}
          </button>
        </form>
      ) : null}

      {newCodes.length ? (
        <section className="card space-y-3" aria-labelledby="new-labels">
          <h2 id="new-labels" className="text-lg font-bold">
            New labels
          </h2>
          <ul className="flex flex-wrap gap-x-4 gap-y-1" aria-label="New unit codes">
            {newCodes.map((c) => (
              <li key={c}>
                <CodeText code={c} />
              </li>
            ))}
          </ul>
          <PrintLabelsButton
            selection={{ kind: 'codes', codes: newCodes }}
            expected={newCodes.length}
            layouts={labels.layouts}
            defaultLayout={labels.defaultLayout}
            label={`Print these ${newCodes.length} label${newCodes.length === 1 ? '' : 's'}`}
          />
        </section>
      ) : null}

      {state === 'draft' || open ? (
        <form onSubmit={cancel} className="card space-y-3" aria-label="Call off" noValidate>
          <h2 className="text-lg font-bold">Call off</h2>
          <p className="text-sm">Nothing more is expected. Anything that already arrived stays on the shelf and in the month’s spend.</p>
          <Field id="cancelNote" label="Why" error={form.err('note')}>
            <input id="cancelNote" name="cancelNote" className="field" />
          </Field>
          <button type="submit" className="btn-danger" disabled={form.busy}>
            Call off this list
          </button>
        </form>
      ) : null}
    </div>
  );
}
