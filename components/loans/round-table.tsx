'use client';
import { useMutation } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type RowSelectionState,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { callApi } from './api';
import { ErrorNote } from './error-note';
import { CARD_TABLE, cardCellProps } from '@/components/ui/card-table';

export type RoundItem = {
  id: string;
  title: string;
  daysLate: number;
  due: string;
  borrowerName: string;
  borrowerEmail: string;
  lines: string[];
  lastReminder: string | null;
  reminders: number;
};

const col = createColumnHelper<RoundItem>();

// The overdue round: most days late first, who has it and how to reach them, what is in it, and a
// reminder for one or for all ticked.
export function RoundTable({ items }: { items: RoundItem[] }) {
  const router = useRouter();
  const [selected, setSelected] = useState<RowSelectionState>({});
  const send = useMutation({
    mutationFn: (loanIds: string[]) =>
      callApi<{ reminders: { sent: number; failed: number } }>('/api/reminders', 'POST', { loanIds }),
    onSuccess: () => {
      setSelected({});
      router.refresh();
    },
  });
  const { mutate, isPending } = send;
  const columns = useMemo(
    () => [
      col.display({
        id: 'pick',
        header: ({ table }) => (
          <input
            type="checkbox"
            className="size-5"
            aria-label="Choose every loan"
            checked={table.getIsAllRowsSelected()}
            onChange={table.getToggleAllRowsSelectedHandler()}
          />
        ),
        cell: ({ row }) => (
          <input
            type="checkbox"
            className="size-5"
            aria-label={`Choose ${row.original.title} of ${row.original.borrowerName}`}
            checked={row.getIsSelected()}
            onChange={row.getToggleSelectedHandler()}
          />
        ),
      }),
      col.accessor('daysLate', { header: 'Days late', cell: (c) => <strong>{c.getValue()}</strong> }),
      col.accessor('borrowerName', {
        header: 'Borrower',
        cell: (c) => (
          <>
            {c.getValue()}
            <a className="block text-sm" href={`mailto:${c.row.original.borrowerEmail}`}>
              {c.row.original.borrowerEmail}
            </a>
          </>
        ),
      }),
      col.accessor('title', {
        header: 'Loan',
        cell: (c) => (
          <>
            <Link href={`/loans/${c.row.original.id}`}>{c.getValue()}</Link>
            <span className="muted block text-sm">due {c.row.original.due}</span>
            <ul className="muted text-sm">
              {c.row.original.lines.map((l) => (
                <li key={l}>{l}</li>
              ))}
            </ul>
          </>
        ),
      }),
      col.accessor('lastReminder', {
        header: 'Reminded',
        cell: (c) => (c.getValue() ? `${c.row.original.reminders}×, last ${c.getValue()}` : 'not yet'),
      }),
      col.display({
        id: 'act',
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => (
          <button
            type="button"
            className="btn-quiet"
            disabled={isPending}
            onClick={() => mutate([row.original.id])}
          >
            Send reminder
          </button>
        ),
      }),
    ],
    [mutate, isPending],
  );
  // TanStack Table hands back fresh functions each render; the compiler leaves this component alone.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: items,
    columns,
    getRowId: (r) => r.id,
    state: { rowSelection: selected },
    onRowSelectionChange: setSelected,
    getCoreRowModel: getCoreRowModel(),
  });
  const chosen = Object.keys(selected).filter((k) => selected[k]);
  if (!items.length) return <p className="muted">Nothing is overdue. Nice.</p>;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <button
          type="button"
          className="btn-primary"
          disabled={!chosen.length || send.isPending}
          onClick={() => send.mutate(chosen)}
        >
          {send.isPending ? 'Sending…' : `Send reminder to ${chosen.length || 'the'} chosen`}
        </button>
        {send.isSuccess ? (
          <p role="status">
            Sent {send.data.reminders.sent} {send.data.reminders.sent === 1 ? 'reminder' : 'reminders'}
            {send.data.reminders.failed ? `, ${send.data.reminders.failed} could not be sent` : ''}.
          </p>
        ) : null}
        <ErrorNote error={send.error} />
      </div>
      <div className="overflow-x-auto">
        <table role="table" className={CARD_TABLE}>
          <thead role="rowgroup">
            {table.getHeaderGroups().map((hg) => (
              <tr role="row" key={hg.id}>
                {hg.headers.map((h) => (
                  <th role="columnheader" key={h.id} scope="col">
                    {flexRender(h.column.columnDef.header, h.getContext())}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody role="rowgroup">
            {table.getRowModel().rows.map((r) => (
              <tr role="row" key={r.id}>
                {r.getVisibleCells().map((c) => (
                  <td role="cell" key={c.id} {...cardCellProps(c.column)}>
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
