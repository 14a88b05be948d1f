import Papa from 'papaparse';

// Every CSV the product writes goes through writeCsv, so every cell passes the same guard. A
// spreadsheet runs a cell that starts with = + - @ (or a tab or carriage return before one of them) as
// a formula: a person named `=HYPERLINK(…)` could otherwise plant a link or a command in the
// treasurer's spreadsheet. Such a cell is written with a leading single quote, which spreadsheets
// read as "this is text" (OWASP, "CSV Injection"). A plain number such as -12.50 is not a formula and
// stays a number, so amounts still add up in the sheet.

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;
const GUARDED = /^'[=+\-@\t\r]/;

/** One cell as it is safe to write: text a spreadsheet would run is kept as text. */
export function csvCell<T>(value: T): T | string {
  return typeof value === 'string' && FORMULA_START.test(value) && !PLAIN_NUMBER.test(value)
    ? `'${value}`
    : value;
}

/** Undoes the guard when one of our files is read back (the parts import). */
export function csvUnguard(value: string): string {
  return GUARDED.test(value) ? value.slice(1) : value;
}

type CsvRow = readonly unknown[] | Readonly<Record<string, unknown>>;

/** A CSV file (CRLF line ends): a header of `fields`, then one line per row, every cell guarded. */
export function writeCsv(fields: readonly string[], rows: readonly CsvRow[]): string {
  const data = rows.map((row) =>
    Array.isArray(row)
      ? row.map(csvCell)
      : fields.map((f) => csvCell((row as Record<string, unknown>)[f] ?? '')),
  );
  return Papa.unparse({ fields: fields.map((f) => String(csvCell(f))), data }, { newline: '\r\n' });
}
