import type { Column } from '@tanstack/react-table';

// Shared by the app's TanStack tables: on a phone, rows become cards (`.table-cards` in app/globals.css) and
// each cell shows its column's name. A column names itself by a string header, or by `meta.label` when its
// header is an element (a checkbox, a sort button) or should read differently on a card.

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData, TValue> {
    /** The column's name beside each cell when rows are cards; '' shows the cell alone. */
    label?: string;
  }
}

/** The attributes of a body cell: its column's name for the phone's card form. */
export function cardCellProps<T>(column: Column<T, unknown>): { 'data-label'?: string } {
  const label =
    column.columnDef.meta?.label ??
    (typeof column.columnDef.header === 'string' ? column.columnDef.header : '');
  return label ? { 'data-label': label } : {};
}

/** The class of a table that turns its rows into cards on a phone. */
export const CARD_TABLE = 'table-dense table-cards';
