'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { InlineError } from '@/components/people/form-field';
import { callApi, errorText, type ApiError } from '@/components/loans/api';
import type { SaleView } from '@/lib/sales/read';
import { formatQty, roundQty } from '@/lib/inventory/measure';
import { formatMoney, formatUnitPrice, lineAmountMinor } from '@/lib/money';
import { MeasuredQtyInput } from '@/components/ui/measured-qty-input';

/** The treasurer's refund: some units of some lines, or everything left; optionally back on the shelf. */
export function RefundForm({ sale, closedMonth }: { sale: SaleView; closedMonth: boolean }) {
  const router = useRouter();
  const id = useId();
  const [qty, setQty] = useState<Record<string, number>>({});
  const [restock, setRestock] = useState(false);
  // "Everything left" takes a second click: it is the one refund that cannot be narrowed afterwards.
  const [confirmAll, setConfirmAll] = useState(false);
  const money = (n: number) => formatMoney(n, sale.currency);
  const chosen = sale.lines
    .filter((l) => (qty[l.id] ?? 0) > 0)
    .map((l) => ({ saleLineId: l.id, qty: qty[l.id] }));
  const chosenMinor = sale.lines.reduce((s, l) => s + lineAmountMinor(qty[l.id] ?? 0, l.unitPriceMinor), 0);
  const refund = useMutation({
    mutationFn: (lines: { saleLineId: string; qty: number }[] | undefined) =>
      callApi<{ refund: { amountMinor: number } }>(`/api/sales/${sale.id}/refunds`, 'POST', {
        ...(lines ? { lines } : {}),
        restock,
      }),
    onSuccess: () => {
      setQty({});
      setConfirmAll(false);
      router.refresh();
    },
  });
  const fields = (refund.error as ApiError | null)?.fields ?? {};
  const lineError = (lineId: string) =>
    fields[`lines.${chosen.findIndex((c) => c.saleLineId === lineId)}.qty`]?.[0];
  const left = sale.lines.some((l) => l.leftQty > 0) && sale.totalMinor > sale.refundedMinor;
  if (!left) return <p className="muted">Nothing is left to refund on this sale.</p>;

  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        refund.mutate(chosen);
      }}
    >
      {closedMonth ? (
        <p className="rounded-lg border border-amber-700 p-2 text-sm">
          This sale’s month is closed. A refund leaves it as it is and goes into the books as a reversing
          entry dated today.
        </p>
      ) : null}
      <table className="table-dense">
        <caption className="sr-only">Lines to refund</caption>
        <thead>
          <tr>
            <th scope="col">Item</th>
            <th scope="col">Bought</th>
            <th scope="col">Refunded</th>
            <th scope="col">Refund now</th>
          </tr>
        </thead>
        <tbody>
          {sale.lines.map((l) => (
            <tr key={l.id}>
              <td>
                {l.name} <span className="muted">@ {formatUnitPrice(l.unitPriceMinor, sale.currency, l.saleUnit)}</span>
              </td>
              <td>{formatQty(l.qty, l.saleUnit)}</td>
              <td>{formatQty(l.refundedQty, l.saleUnit)}</td>
              <td>
                <label htmlFor={`${id}-${l.id}`} className="sr-only">
                  Units of {l.name} to refund
                </label>
                {l.leftQty === 0 ? (
                  <span className="muted">all refunded</span>
                ) : (
                  <MeasuredQtyInput
                    id={`${id}-${l.id}`}
                    measure={l.saleUnit}
                    value={qty[l.id] ?? 0}
                    className="field w-24 min-h-9 py-1"
                    onChange={(q) => setQty({ ...qty, [l.id]: Math.max(0, Math.min(l.leftQty, roundQty(q ?? 0))) })}
                  />
                )}
                {lineError(l.id) ? (
                  <p className="text-sm text-red-800 dark:text-red-300">{lineError(l.id)}</p>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <label className="flex items-center gap-2">
        <input
          type="checkbox"
          className="size-4"
          checked={restock}
          onChange={(e) => setRestock(e.target.checked)}
        />
        Put the refunded items back on the shelf
      </label>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={chosen.length === 0 || refund.isPending}>
          Refund {money(chosenMinor)}
        </button>
        <button
          type="button"
          className="btn-danger"
          disabled={refund.isPending}
          onClick={() => (confirmAll ? refund.mutate(undefined) : setConfirmAll(true))}
        >
          {confirmAll ? 'Yes, refund' : 'Refund everything left'} (
          {money(sale.totalMinor - sale.refundedMinor)})
        </button>
      </div>
      {refund.isError ? <InlineError alert>{errorText(refund.error)}</InlineError> : null}
      {refund.isSuccess ? <p role="status">Refunded {money(refund.data.refund.amountMinor)}.</p> : null}
    </form>
  );
}
