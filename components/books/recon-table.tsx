'use client';
import { createColumnHelper } from '@tanstack/react-table';
import { useId, useState } from 'react';
import type { ReconRow } from '@/lib/reconcile/match';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { DataTable } from './data-table';
import { ReconStatusBadge } from './recon-status';
import { SaleRef } from './sale-ref';

const col = createColumnHelper<ReconRow>();

/** The month's reconciliation, one row per charge or refund, with a filter for what needs a look. */
export function ReconTable({
  rows,
  currency,
  timeZone,
}: {
  rows: ReconRow[];
  currency: string;
  timeZone: string;
}) {
  const id = useId();
  const [show, setShow] = useState<'all' | 'problems' | 'matched'>('all');
  const money = (n: number | null) => (n === null ? '—' : formatMoney(n, currency));
  const shown = rows.filter(
    (r) => show === 'all' || (show === 'matched' ? r.status === 'matched' : r.status !== 'matched'),
  );
  const columns = [
    col.accessor('status', { header: 'State', cell: (c) => <ReconStatusBadge status={c.getValue()} /> }),
    col.accessor('kind', { header: 'Kind' }),
    col.accessor('at', {
      header: 'When',
      cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue(), timeZone)}</span>,
    }),
    col.accessor('buyer', { header: 'Buyer', cell: (c) => c.getValue() ?? '—' }),
    col.accessor('saleId', { header: 'Sale', cell: (c) => <SaleRef id={c.getValue()} /> }),
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
      header: 'Net',
      cell: (c) => <span className="tabular-nums">{money(c.getValue())}</span>,
    }),
    col.accessor('processorId', {
      header: 'Processor ref',
      cell: (c) => <span className="font-mono text-xs">{c.getValue() ?? '—'}</span>,
    }),
    col.accessor('note', { header: 'Note', enableSorting: false }),
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
          <option value="matched">matched ({rows.filter((r) => r.status === 'matched').length})</option>
        </select>
      </div>
      <DataTable
        data={shown}
        columns={columns}
        caption="Our sales and refunds beside the processor's ledger"
        empty="Nothing in this month on either side."
        rowKey={(r) => r.key}
        rowAttrs={(r) => ({ 'data-sale': r.saleId ?? '', 'data-status': r.status })}
      />
    </div>
  );
}
