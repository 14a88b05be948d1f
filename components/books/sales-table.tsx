'use client';
import { createColumnHelper } from '@tanstack/react-table';
import type { SaleListRow } from '@/lib/reconcile/sales-list';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { saleRef } from '@/lib/sales/ref';
import { StatePill } from '@/components/ui/state-pill';
import { DataTable } from './data-table';
import { SaleRef } from './sale-ref';

const col = createColumnHelper<SaleListRow>();

/** Every sale of the month, any state; a sale's page holds its refunds. */
export function SalesTable({
  sales,
  currency,
  timeZone,
}: {
  sales: SaleListRow[];
  currency: string;
  timeZone: string;
}) {
  const columns = [
    col.accessor('id', { header: 'Sale', cell: (c) => <SaleRef id={c.getValue()} /> }),
    col.accessor('createdAt', {
      header: 'Started',
      cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue(), timeZone)}</span>,
    }),
    col.accessor('buyer', { header: 'Buyer', cell: (c) => c.getValue() ?? '—' }),
    col.accessor('method', { header: 'Paid by' }),
    col.accessor('status', {
      header: 'State',
      cell: (c) => (
        <>
          <StatePill state={c.getValue()} />
          {c.row.original.reversesSaleId ? (
            <span className="muted ml-1 text-xs">reverses {saleRef(c.row.original.reversesSaleId)}</span>
          ) : null}
        </>
      ),
    }),
    col.accessor('lines', { header: 'Lines' }),
    col.accessor('totalMinor', {
      header: 'Total',
      cell: (c) => (
        <span className="tabular-nums">
          {(c.row.original.status === 'reversed' ? '−' : '') + formatMoney(c.getValue(), currency)}
        </span>
      ),
    }),
  ];
  return (
    <DataTable
      data={sales}
      columns={columns}
      caption="Sales of the month"
      empty="No sales in this month."
      rowKey={(r) => r.id}
    />
  );
}
