'use client';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { CircleCheck, Clock, OctagonX } from 'lucide-react';
import Link from 'next/link';
import { useEffect } from 'react';
import { callApi, errorText } from '@/components/loans/api';
import type { SaleView } from '@/lib/sales/read';
import { formatQty } from '@/lib/inventory/measure';
import { formatMoney, lineAmountMinor } from '@/lib/money';
import { receiptTaxLines } from '@/lib/sales/tax';
import { formatDateTimeWithZone } from '@/lib/zoned-time';
import { settleStoredBasket } from './basket-store';

const PAID = new Set(['paid', 'partially_refunded', 'refunded']);

// Where the processor's page sends the buyer back. The sale's state comes from the server, which
// hears it from the signed webhook; this page polls (reads only) until the sale is no longer pending.
// "Check again" asks the processor directly (a POST), and is sent once by itself when the payment
// page has run out, so a sale nobody can pay any more ends without waiting for anyone.
export function SaleStatus({ saleId, cancelled, me }: { saleId: string; cancelled: boolean; me: string }) {
  const queryClient = useQueryClient();
  const cancel = useMutation({ mutationFn: () => callApi(`/api/sales/${saleId}/cancel`, 'POST') });
  const { mutate: cancelNow } = cancel;
  useEffect(() => {
    if (cancelled) cancelNow();
  }, [cancelled, cancelNow]);

  const q = useQuery({
    queryKey: ['sale', saleId],
    queryFn: () => callApi<{ sale: SaleView }>(`/api/sales/${saleId}`, 'GET').then((r) => r.sale),
    refetchInterval: (query) => (query.state.data?.status === 'pending' ? 1500 : false),
    staleTime: 0,
  });
  const check = useMutation({
    mutationFn: () => callApi<{ sale: SaleView }>(`/api/sales/${saleId}/settle`, 'POST').then((r) => r.sale),
    onSuccess: (sale) => queryClient.setQueryData(['sale', saleId], sale),
  });
  const { mutate: checkNow, isIdle: notCheckedYet } = check;
  const runOut =
    q.data?.status === 'pending' && q.data.expiresAt !== null && new Date(q.data.expiresAt) < new Date();
  useEffect(() => {
    if (runOut && notCheckedYet) checkNow();
  }, [runOut, notCheckedYet, checkNow]);

  // The basket this sale came from is kept (Back from the card page finds it) until the sale has ended.
  const ended = q.data !== undefined && q.data.status !== 'pending';
  useEffect(() => {
    if (ended) settleStoredBasket(me, saleId);
  }, [ended, me, saleId]);

  if (q.isPending) return <p role="status">Looking up the sale…</p>;
  if (q.isError) return <p role="alert">{errorText(q.error)}</p>;
  const sale = q.data;
  const money = (n: number) => formatMoney(n, sale.currency);
  const taxLines = receiptTaxLines({ ...sale.tax, totalMinor: sale.totalMinor });

  return (
    <div className="card space-y-3" data-sale-status={sale.status}>
      {sale.status === 'pending' ? (
        <div className="space-y-2">
          <p role="status" className="flex items-center gap-2 text-lg font-bold">
            <Clock aria-hidden className="size-6" /> Waiting for the card processor to confirm…
          </p>
          <button
            type="button"
            className="btn-quiet"
            onClick={() => check.mutate()}
            disabled={check.isPending}
          >
            {check.isPending ? 'Asking the processor…' : 'Check again'}
          </button>
          {check.isError ? <p role="alert">{errorText(check.error)}</p> : null}
        </div>
      ) : PAID.has(sale.status) ? (
        <p
          role="status"
          className="flex items-center gap-2 text-lg font-bold text-green-900 dark:text-green-200"
        >
          <CircleCheck aria-hidden className="size-6" /> Paid. Your receipt is on its way by e-mail.
        </p>
      ) : (
        <p role="status" className="flex items-center gap-2 text-lg font-bold text-red-900 dark:text-red-200">
          <OctagonX aria-hidden className="size-6" /> Not paid (
          {sale.status === 'expired' ? 'cancelled or timed out' : 'card declined or payment failed'}). Nothing
          was taken from the shelf.
        </p>
      )}
      <ul className="divide-y divide-stone-200 dark:divide-stone-800">
        {sale.lines.map((l) => (
          <li key={l.id} className="flex justify-between gap-3 py-1.5">
            <span>
              {l.saleUnit === 'each' ? `${l.qty} ×` : `${formatQty(l.qty, l.saleUnit)} of`} {l.name}
            </span>
            <span className="tabular-nums">{money(lineAmountMinor(l.qty, l.unitPriceMinor))}</span>
          </li>
        ))}
      </ul>
      {taxLines.before.map((l) => (
        <p key={l.label} className="flex justify-between gap-3" data-testid="receipt-tax">
          <span>{l.label}</span>
          <span className="tabular-nums">{money(l.minor)}</span>
        </p>
      ))}
      <p className="flex justify-between text-lg font-bold">
        <span>Total</span>
        <span className="tabular-nums" data-testid="receipt-total">{money(sale.totalMinor)}</span>
      </p>
      {taxLines.after.map((l) => (
        <p key={l.label} className="muted flex justify-between gap-3 text-sm" data-testid="receipt-tax">
          <span>{l.label}</span>
          <span className="tabular-nums">{money(l.minor)}</span>
        </p>
      ))}
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm" data-testid="receipt-facts">
        <dt className="muted">Sale reference</dt>
        <dd className="font-mono" data-testid="sale-ref">
          {sale.ref}
        </dd>
        <dt className="muted">{sale.paidAt ? 'Paid' : 'Started'}</dt>
        <dd data-testid="sale-time">
          {formatDateTimeWithZone(sale.paidAt ?? sale.createdAt, sale.timeZone)}
        </dd>
      </dl>
      <Link href="/counter" className="btn-quiet">
        Back to the counter
      </Link>
    </div>
  );
}
