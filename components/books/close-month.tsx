'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { InlineError } from '@/components/people/form-field';
import { callApi, errorText } from '@/components/loans/api';
import type { BooksRow } from '@/lib/reconcile/report';
import { formatMoney } from '@/lib/money';
import { reconWord } from './recon-status';
import { SaleRef } from './sale-ref';

type Open = Pick<
  BooksRow,
  'key' | 'saleId' | 'status' | 'kind' | 'oursMinor' | 'theirsMinor' | 'differenceMinor'
>;

/**
 * Closes an ended month. Rows that do not match and carry no note are listed first; closing with
 * them takes a confirmation that names how many (the server checks the same number).
 */
export function CloseMonth({
  month,
  label,
  unresolved,
  currency,
}: {
  month: string;
  label: string;
  unresolved: Open[];
  currency: string;
}) {
  const router = useRouter();
  const n = unresolved.length;
  const [sure, setSure] = useState(false);
  const close = useMutation({
    mutationFn: () => callApi('/api/books/periods', 'POST', n ? { month, confirmUnresolved: n } : { month }),
    onSuccess: () => router.refresh(),
  });
  const amount = (r: Open) =>
    r.differenceMinor
      ? formatMoney(r.differenceMinor, currency)
      : formatMoney(r.oursMinor ?? r.theirsMinor ?? 0, currency);
  return (
    <div className="space-y-2" data-testid="close-month">
      {n > 0 ? (
        <>
          <p className="text-sm font-semibold">
            {n} {n === 1 ? 'row does' : 'rows do'} not match and {n === 1 ? 'has' : 'have'} no note yet:
          </p>
          <ul className="space-y-1 text-sm" data-testid="unresolved-rows">
            {unresolved.map((r) => (
              <li key={r.key} className="flex flex-wrap gap-x-2">
                {r.saleId ? (
                  <SaleRef id={r.saleId} />
                ) : (
                  <span>{r.kind === 'refund' ? 'A refund' : 'A charge'}</span>
                )}
                <span>{reconWord(r.status)}</span>
                <span className="tabular-nums">{amount(r)}</span>
              </li>
            ))}
          </ul>
          <p className="muted text-sm">Explain each in the table below, or close with them unresolved.</p>
          <label className="flex items-start gap-2 text-sm">
            <input
              type="checkbox"
              className="mt-1 size-4"
              checked={sure}
              onChange={(e) => setSure(e.target.checked)}
            />
            <span>
              Close {label} with {n} unresolved {n === 1 ? 'row' : 'rows'} (later changes go in as reversing
              entries).
            </span>
          </label>
        </>
      ) : null}
      <button
        type="button"
        className="btn-quiet"
        disabled={(n > 0 && !sure) || close.isPending}
        onClick={() => close.mutate()}
      >
        {close.isPending ? 'Closing…' : n > 0 ? `Close ${label} with ${n} unresolved` : `Close ${label}`}
      </button>
      {close.isError ? <InlineError alert>{errorText(close.error)}</InlineError> : null}
    </div>
  );
}
