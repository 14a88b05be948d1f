'use client';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useEffect, useMemo, useState } from 'react';
import { ArrowDown, ArrowUp, ArrowUpDown, Download } from 'lucide-react';
import type { PartPage, PartRow } from '@/lib/inventory/parts-list';
import type { PartListQuery } from '@/lib/inventory/schemas';
import { CATEGORIES, CATEGORY_WORDS, type PartSort } from '@/lib/inventory/words';
import { formatQty } from '@/lib/inventory/measure';
import { formatUnitPrice } from '@/lib/money';
import { api } from './api';
import { partsQueryString } from './query-string';
import { ScrollRegion } from './scroll-region';
import { CARD_TABLE, cardCellProps } from '@/components/ui/card-table';

const SORTABLE: Partial<Record<string, PartSort>> = {
  name: 'name',
  sku: 'sku',
  category: 'category',
  onHand: 'onHand',
  reorderPoint: 'reorderPoint',
};

const PHONE_SORTS: [string, string][] = [
  ['name:asc', 'Name, A to Z'],
  ['name:desc', 'Name, Z to A'],
  ['onHand:asc', 'On hand, fewest first'],
  ['onHand:desc', 'On hand, most first'],
  ['category:asc', 'Category'],
  ['sku:asc', 'SKU'],
  ['reorderPoint:desc', 'Reorder at, highest first'],
];

function columns(currency: string): ColumnDef<PartRow>[] {
  return [
    {
      id: 'name',
      header: 'Part',
      meta: { label: '' },
      cell: ({ row }) => (
        <Link href={`/shelf/parts/${row.original.id}`} className="font-semibold">
          {row.original.name}
        </Link>
      ),
    },
    {
      id: 'sku',
      header: 'SKU',
      cell: ({ row }) => <span className="font-mono text-xs">{row.original.sku}</span>,
    },
    { id: 'category', header: 'Category', cell: ({ row }) => CATEGORY_WORDS[row.original.category] },
    {
      id: 'keySpec',
      header: 'Key spec',
      cell: ({ row }) => <span className="whitespace-nowrap">{row.original.keySpec}</span>,
    },
    {
      id: 'onHand',
      header: 'On hand',
      cell: ({ row }) => {
        const r = row.original;
        return (
          <span className="whitespace-nowrap tabular-nums">
            {formatQty(r.onHand, r.tracking === 'unit' ? 'each' : r.saleUnit)}
            {r.tracking === 'unit' ? <span className="muted"> of {r.unitsTotal} units</span> : null}
            {r.below ? (
              <span className="ml-2 rounded border border-amber-700 px-1 text-xs font-semibold text-amber-950 dark:text-amber-200">
                below reorder
              </span>
            ) : null}
          </span>
        );
      },
    },
    {
      id: 'reorderPoint',
      header: 'Reorder at',
      cell: ({ row }) => <span className="tabular-nums">{row.original.reorderPoint || '—'}</span>,
    },
    {
      id: 'price',
      header: 'Price',
      cell: ({ row }) =>
        row.original.priceMinor === null
          ? '—'
          : formatUnitPrice(row.original.priceMinor, currency, row.original.saleUnit),
    },
  ];
}

/** The dense parts table: every filter, sort and page is done by the server; the URL keeps the view. */
export function PartsTable({ initial, initialQuery }: { initial: PartPage; initialQuery: PartListQuery }) {
  const [query, setQuery] = useState<PartListQuery>(initialQuery);
  const [search, setSearch] = useState(initialQuery.q ?? '');
  const qs = partsQueryString(query);
  const initialQs = useMemo(() => partsQueryString(initialQuery), [initialQuery]);

  const { data, isFetching, error } = useQuery({
    queryKey: ['parts', qs],
    queryFn: () => api<PartPage>(`/api/parts?${qs}`),
    initialData: qs === initialQs ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const page = data ?? initial;

  // The address bar follows the table, so a view can be bookmarked or shared.
  useEffect(() => {
    // The browser's own history API: Next keeps it in step without re-rendering the page on the server.
    window.history.replaceState(null, '', qs ? `/shelf?${qs}` : '/shelf');
  }, [qs]);

  // Typing searches after a short pause rather than on every key.
  useEffect(() => {
    const t = setTimeout(
      () => setQuery((q) => ((q.q ?? '') === search ? q : { ...q, q: search || undefined, page: 1 })),
      250,
    );
    return () => clearTimeout(t);
  }, [search]);

  const sorting: SortingState = [{ id: query.sort, desc: query.dir === 'desc' }];
  const cols = useMemo(() => columns(page.currency), [page.currency]);
  // TanStack Table returns fresh functions each render by design; the compiler leaves this component alone.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: page.rows,
    columns: cols,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    pageCount: Math.max(1, Math.ceil(page.total / page.pageSize)),
    state: { sorting },
    getRowId: (r) => r.id,
  });

  const pages = Math.max(1, Math.ceil(page.total / page.pageSize));
  const sortBy = (id: string) => {
    const key = SORTABLE[id];
    if (!key) return;
    setQuery((q) => ({ ...q, sort: key, dir: q.sort === key && q.dir === 'asc' ? 'desc' : 'asc', page: 1 }));
  };

  return (
    <div className="space-y-3">
      <form role="search" className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <div className="min-w-56 flex-1">
          <label htmlFor="parts-search" className="label">
            Search name, SKU or code
          </label>
          <input
            id="parts-search"
            type="search"
            className="field"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="e.g. buck 350"
          />
        </div>
        <div>
          <label htmlFor="parts-category" className="label">
            Category
          </label>
          <select
            id="parts-category"
            className="field"
            value={query.category ?? ''}
            onChange={(e) =>
              setQuery((q) => ({
                ...q,
                category: (e.target.value || undefined) as PartListQuery['category'],
                page: 1,
              }))
            }
          >
            <option value="">All</option>
            {CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {CATEGORY_WORDS[c]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="parts-tracking" className="label">
            Tracked as
          </label>
          <select
            id="parts-tracking"
            className="field"
            value={query.tracking ?? ''}
            onChange={(e) =>
              setQuery((q) => ({
                ...q,
                tracking: (e.target.value || undefined) as PartListQuery['tracking'],
                page: 1,
              }))
            }
          >
            <option value="">Either</option>
            <option value="counted">Counted</option>
            <option value="unit">Labelled units</option>
          </select>
        </div>
        <label className="flex min-h-11 items-center gap-2 text-sm font-semibold">
          <input
            type="checkbox"
            className="size-5"
            checked={query.below}
            onChange={(e) => setQuery((q) => ({ ...q, below: e.target.checked, page: 1 }))}
          />
          Below reorder point
        </label>
        <div className="sm:hidden">
          <label htmlFor="parts-sort" className="label">
            Sort by
          </label>
          {/* On a phone the rows are cards and the column headers are hidden: sorting is chosen here. */}
          <select
            id="parts-sort"
            className="field"
            value={`${query.sort}:${query.dir}`}
            onChange={(e) => {
              const [sort, dir] = e.target.value.split(':') as [PartSort, 'asc' | 'desc'];
              setQuery((q) => ({ ...q, sort, dir, page: 1 }));
            }}
          >
            {PHONE_SORTS.map(([value, words]) => (
              <option key={value} value={value}>
                {words}
              </option>
            ))}
          </select>
        </div>
        <a
          className="btn-quiet"
          href={`/api/parts/export?${partsQueryString(query, ['page', 'pageSize'])}`}
          download
        >
          <Download aria-hidden className="size-4" /> Export CSV
        </a>
      </form>

      <p className="muted text-sm" aria-live="polite">
        {page.total} part{page.total === 1 ? '' : 's'}
        {isFetching ? ' · updating…' : ''}
        {error ? ` · ${(error as Error).message}` : ''}
      </p>

      <ScrollRegion label="Parts">
        <table role="table" className={CARD_TABLE}>
          <thead role="rowgroup">
            {table.getHeaderGroups().map((hg) => (
              <tr role="row" key={hg.id}>
                {hg.headers.map((h) => {
                  const sortable = Boolean(SORTABLE[h.column.id]);
                  const active = query.sort === SORTABLE[h.column.id];
                  const Icon = !active ? ArrowUpDown : query.dir === 'asc' ? ArrowUp : ArrowDown;
                  return (
                    <th
                      role="columnheader"
                      key={h.id}
                      scope="col"
                      aria-sort={active ? (query.dir === 'asc' ? 'ascending' : 'descending') : undefined}
                    >
                      {sortable ? (
                        <button
                          type="button"
                          className="inline-flex items-center gap-1 font-semibold"
                          onClick={() => sortBy(h.column.id)}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <Icon aria-hidden className="size-3.5" />
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
            {table.getRowModel().rows.map((row) => (
              <tr role="row" key={row.id}>
                {row.getVisibleCells().map((cell) => (
                  <td role="cell" key={cell.id} {...cardCellProps(cell.column)}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {page.rows.length === 0 ? (
              <tr role="row">
                <td role="cell" colSpan={cols.length} className="muted py-6 text-center">
                  No parts match. Clear a filter, or add a part.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </ScrollRegion>

      <nav aria-label="Pages" className="flex flex-wrap items-center gap-2">
        <button
          type="button"
          className="btn-quiet"
          disabled={query.page <= 1}
          onClick={() => setQuery((q) => ({ ...q, page: q.page - 1 }))}
        >
          Previous
        </button>
        <span className="text-sm">
          Page {Math.min(query.page, pages)} of {pages}
        </span>
        <button
          type="button"
          className="btn-quiet"
          disabled={query.page >= pages}
          onClick={() => setQuery((q) => ({ ...q, page: q.page + 1 }))}
        >
          Next
        </button>
        <label className="ml-auto flex items-center gap-2 text-sm">
          Rows per page
          <select
            className="field w-auto"
            value={query.pageSize}
            onChange={(e) => setQuery((q) => ({ ...q, pageSize: Number(e.target.value), page: 1 }))}
          >
            {[25, 50, 100, 200].map((n) => (
              <option key={n}>{n}</option>
            ))}
          </select>
        </label>
      </nav>
    </div>
  );
}
