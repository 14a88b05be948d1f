'use client';
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp } from 'lucide-react';
import { useState } from 'react';
import { CARD_TABLE, cardCellProps } from '@/components/ui/card-table';

/** A dense, sortable table (books, people): on a laptop a table, on a phone each row a card. */
export function DataTable<T>({
  data,
  columns,
  caption,
  empty,
  rowKey,
  rowAttrs,
}: {
  data: T[];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  caption: string;
  empty: string;
  rowKey: (row: T) => string;
  rowAttrs?: (row: T) => Record<string, string>;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  // TanStack Table hands back fresh functions each render; the React Compiler skips this component.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: rowKey,
  });
  return (
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label={caption}>
      <table role="table" className={CARD_TABLE}>
        <caption className="sr-only">{caption}</caption>
        <thead role="rowgroup">
          {table.getHeaderGroups().map((g) => (
            <tr role="row" key={g.id}>
              {g.headers.map((h) => {
                const dir = h.column.getIsSorted();
                return (
                  <th
                    role="columnheader"
                    key={h.id}
                    scope="col"
                    aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined}
                  >
                    {h.column.getCanSort() ? (
                      <button
                        type="button"
                        className="inline-flex items-center gap-1 font-semibold"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {dir === 'asc' ? (
                          <ArrowUp aria-hidden className="size-3.5" />
                        ) : dir === 'desc' ? (
                          <ArrowDown aria-hidden className="size-3.5" />
                        ) : null}
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody role="rowgroup">
          {table.getRowModel().rows.map((r) => (
            <tr role="row" key={r.id} {...(rowAttrs?.(r.original) ?? {})}>
              {r.getVisibleCells().map((c) => (
                <td role="cell" key={c.id} {...cardCellProps(c.column)}>
                  {flexRender(c.column.columnDef.cell, c.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {data.length === 0 ? (
            <tr role="row">
              <td role="cell" colSpan={columns.length} className="muted">
                {empty}
              </td>
            </tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}
