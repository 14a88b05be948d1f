'use client';
import { createColumnHelper } from '@tanstack/react-table';
import { useId, useState } from 'react';
import type { BooksRow } from '@/lib/reconcile/report';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { DataTable } from './data-table';
import { ReconStatusBadge } from './recon-status';
import { ProcessorRefs } from './processor-refs';
import { ResolveRow } from './resolve-row';
import { SaleRef } from './sale-ref';

const col = createColumnHelper<BooksRow>();

/**
 * The month's reconciliation, one row per sale payment or refund, led by our short sale reference;
 * the processor's identifiers sit one tap away in each row. A row that does not match takes a note.
 */
export function ReconTable({
  month,
  rows,
  currency,
  timeZone,
}: {
  month: string;
  rows: BooksRow[];
  currency: string;
  timeZone: string;
}) {
  const id = useId();
  const [show, setShow] = useState<'all' | 'problems' | 'unresolved' | 'matched'>('all');
  const money = (n: number | null) => (n === null ? '—' : formatMoney(n, currency));
  const shown = rows.filter((r) =>
    show === 'all'
      ? true
      : show === 'matched'
        ? r.status === 'matched'
        : r.status !== 'matched' && (show === 'problems' || !r.resolution),
  );
  const columns = [
    col.accessor('saleId', {
      header: 'Sale',
      cell: (c) => <SaleRef id={c.getValue()} />,
      sortingFn: (a, b) => (a.original.saleRef ?? '').localeCompare(b.original.saleRef ?? ''),
    }),
    col.accessor('status', { header: 'State', cell: (c) => <ReconStatusBadge status={c.getValue()} /> }),
    col.accessor('kind', {
      header: 'Entry',
      cell: (c) => (c.getValue() === 'charge' ? 'sale payment' : 'refund'),
    }),
    col.accessor('at', {
      header: 'When',
      cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue(), timeZone)}</span>,
    }),
    col.accessor('buyer', { header: 'Buyer', cell: (c) => c.getValue() ?? '—' }),
    col.accessor('oursMinor', {
      header: 'Our books',
      cell: (c) => <span className="tabular-nums">{money(c.getValue())}</span>,
    }),
    col.accessor('theirsMinor', {
      header: 'Processor',
      cell: (c) => <span className="tabular-nums">{money(c.getValue())}</span>,
    }),
    col.accessor('differenceMinor', {
      header: 'Difference',
      cell: (c) => (
        <span className={c.getValue() ? 'font-bold tabular-nums' : 'tabular-nums'}>
          {c.getValue() ? money(c.getValue()) : '—'}
        </span>
      ),
    }),
    col.accessor('feeMinor', {
      header: 'Fee',
      cell: (c) => <span className="tabular-nums">{money(c.getValue())}</span>,
    }),
    col.accessor('netMinor', {
      header: 'After fee',
      cell: (c) => <span className="tabular-nums">{money(c.getValue())}</span>,
    }),
    col.display({
      id: 'explained',
      header: 'What happened',
      cell: (c) => {
        const r = c.row.original;
        // Nothing to say on a matched row without a note: the cell stays empty (and off the phone's card).
        if (!r.note && r.status === 'matched') return null;
        return (
          <div className="space-y-1">
            {r.note ? <p className="text-sm">{r.note}</p> : null}
            {r.status === 'matched' ? null : (
              <ResolveRow month={month} rowKey={r.key} resolution={r.resolution} timeZone={timeZone} />
            )}
          </div>
        );
      },
    }),
    col.display({
      id: 'refs',
      header: 'Processor’s refs',
      cell: (c) => <ProcessorRefs paymentRef={c.row.original.processorId} ledgerRef={c.row.original.txnId} />,
    }),
  ];
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-2">
        <label htmlFor={`${id}-show`} className="label mb-0">
          Show
        </label>
        <select
          id={`${id}-show`}
          className="field w-auto min-h-9 py-1"
          value={show}
          onChange={(e) => setShow(e.target.value as typeof show)}
        >
          <option value="all">everything ({rows.length})</option>
          <option value="problems">needs a look ({rows.filter((r) => r.status !== 'matched').length})</option>
          <option value="unresolved">
            not explained yet ({rows.filter((r) => r.status !== 'matched' && !r.resolution).length})
          </option>
          <option value="matched">matched ({rows.filter((r) => r.status === 'matched').length})</option>
        </select>
      </div>
      <DataTable
        data={shown}
        columns={columns}
        caption="Our sales and refunds beside the processor's records"
        empty="Nothing in this month on either side."
        rowKey={(r) => r.key}
        rowAttrs={(r) => ({ 'data-sale': r.saleId ?? '', 'data-status': r.status })}
      />
    </div>
  );
}
