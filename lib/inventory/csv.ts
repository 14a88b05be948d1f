// CSV in and out for the parts table. Pure (papaparse + zod): the import's checks run here row by
// row against a snapshot of the space (existing SKUs, bins), so the preview and the commit use the
// very same rules, and unit tests can feed it text directly.
import Papa from 'papaparse';
import type { PartCategory } from '@/db/types';
import { csvUnguard, writeCsv } from '@/lib/csv';
import { minorUnitExponent, parseMoney } from '@/lib/money';
import { measureOf, parseMeasure, parseQtyInput, qtyProblem, type Measure } from './measure';
import { CATEGORIES, CATEGORY_WORDS } from './schemas';
import { parseSpecs } from './specs';
import { SPEC_FIELDS } from './words';

export const MAX_IMPORT_ROWS = 2000;

/** Columns the export writes that the import reads past (they are figures, not inputs). */
const EXPORT_ONLY = new Set(['code', 'on_hand', 'units', 'key_spec', 'below_reorder', 'updated_at']);
const KNOWN = new Set([
  'sku',
  'name',
  'category',
  'tracking',
  'reorder_point',
  'price',
  'sale_unit',
  'sellable',
  'lendable',
  'notes',
  'location',
  'qty',
]);

export type RowError = { row: number; field: string; message: string };

export type ExistingPart = {
  id: string;
  sku: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  specs: Record<string, unknown>;
  /** Its unit of measure; missing reads as 'each'. */
  sale_unit?: string;
};
export type ImportContext = {
  currency: string;
  /** By SKU, exactly as stored. */
  parts: Map<string, ExistingPart>;
  /** By label code and by lower-case name. */
  locations: Map<string, string>;
};

export type ImportRow = {
  row: number;
  action: 'create' | 'update';
  partId?: string;
  sku: string;
  name?: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  specs?: Record<string, unknown>;
  reorderPoint?: number;
  priceMinor?: number | null;
  saleUnit?: Measure;
  sellable?: boolean;
  lendable?: boolean;
  notes?: string;
  locationId?: string;
  locationLabel?: string;
  qty?: number;
};

export type ImportCheck = { rows: ImportRow[]; errors: RowError[]; ignoredColumns: string[]; total: number };

/** Plain columns compare in lower case; a `spec.<key>` column keeps its key as written. */
function headerKey(h: string): string {
  const t = h.trim();
  const spec = /^specs?\.(.+)$/i.exec(t);
  return spec ? `spec.${spec[1].trim()}` : t.toLowerCase().replace(/[\s-]+/g, '_');
}

/** `spec.vfmin` still means vfMin: spec keys match the category's own fields whatever their case. */
function specKey(category: PartCategory, written: string): string {
  return SPEC_FIELDS[category]?.find((f) => f.key.toLowerCase() === written.toLowerCase())?.key ?? written;
}
/** Undo the export's guard against spreadsheet formulas ('=…). */
const unguard = csvUnguard;

const TRUE = new Set(['yes', 'y', 'true', '1', 'x']);
const FALSE = new Set(['no', 'n', 'false', '0', '']);
function bool(v: string): boolean | 'bad' {
  const s = v.trim().toLowerCase();
  return TRUE.has(s) ? true : FALSE.has(s) ? false : 'bad';
}

function category(v: string): PartCategory | undefined {
  const s = v
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
  if ((CATEGORIES as readonly string[]).includes(s)) return s as PartCategory;
  return (
    (Object.entries(CATEGORY_WORDS).find(
      ([, w]) => w.toLowerCase().replace(/\s+/g, '_') === s,
    )?.[0] as PartCategory) ?? undefined
  );
}

/** A spec cell: numbers as numbers, yes/no as booleans, anything else as text for the schema to judge. */
function specValue(v: string): unknown {
  const s = v.trim();
  if (s === '') return '';
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s)) return Number(s);
  const b = bool(s);
  return b === 'bad' ? s : b;
}

const wholeNumber = (v: string) => (/^\s*\d+\s*$/.test(v) ? Number(v) : NaN);

/**
 * Checks every row; row numbers are the spreadsheet's (the header is row 1). A row with errors
 * still appears in `rows` only when it has none — the commit refuses everything if any row fails.
 */
export function checkImport(csv: string, ctx: ImportContext): ImportCheck {
  const parsed = Papa.parse<string[]>(csv.replace(/^\ufeff/, ''), { skipEmptyLines: false });
  const records = parsed.data;
  // A file with one column has no delimiter to detect: that notice is not a problem with the file.
  const errors: RowError[] = parsed.errors
    .filter((e) => e.type !== 'Delimiter')
    .map((e) => ({ row: (e.row ?? 0) + 1, field: '(file)', message: e.message }));
  const header = (records[0] ?? []).map(headerKey);
  if (!header.includes('sku'))
    errors.push({ row: 1, field: 'sku', message: 'the header row needs a "sku" column' });
  const ignoredColumns = header.filter(
    (h) => h && !KNOWN.has(h) && !EXPORT_ONLY.has(h) && !h.startsWith('spec.'),
  );
  const rows: ImportRow[] = [];
  const firstRowOfSku = new Map<string, number>();
  let total = 0;

  for (let i = 1; i < records.length; i++) {
    const rec = records[i];
    if (rec.every((c) => c.trim() === '')) continue;
    total++;
    const row = i + 1;
    if (total > MAX_IMPORT_ROWS) {
      errors.push({ row, field: '(file)', message: `at most ${MAX_IMPORT_ROWS} rows per import` });
      break;
    }
    const cell = (k: string) => {
      const j = header.indexOf(k);
      return j < 0 ? undefined : unguard((rec[j] ?? '').trim());
    };
    const rowErrors: RowError[] = [];
    const err = (field: string, message: string) => rowErrors.push({ row, field, message });

    const sku = cell('sku') ?? '';
    if (!sku) err('sku', 'SKU is required');
    else if (!/^[A-Za-z0-9][A-Za-z0-9._/-]*$/.test(sku) || sku.length > 60)
      err('sku', 'SKU may use letters, digits and . _ / - (at most 60, no spaces)');
    else if (firstRowOfSku.has(sku))
      err('sku', `SKU ${sku} appears again (first on row ${firstRowOfSku.get(sku)})`);
    else firstRowOfSku.set(sku, row);

    const existing = ctx.parts.get(sku);
    const name = cell('name');
    if (!existing && !name) err('name', 'name is required for a new part');
    if (name && name.length > 200) err('name', 'name is at most 200 characters');

    const catText = cell('category');
    const cat = catText ? category(catText) : existing?.category;
    if (catText && !cat)
      err('category', `unknown category "${catText}"; use one of ${CATEGORIES.join(', ')}`);
    if (!catText && !existing) err('category', 'category is required for a new part');

    const trackText = cell('tracking')?.toLowerCase();
    const tracking: 'counted' | 'unit' | undefined = !trackText
      ? (existing?.tracking ?? 'counted')
      : ['counted', 'count'].includes(trackText)
        ? 'counted'
        : ['unit', 'units', 'labelled', 'labeled'].includes(trackText)
          ? 'unit'
          : undefined;
    if (!tracking) err('tracking', 'tracking is "counted" or "unit"');
    else if (existing && tracking !== existing.tracking)
      err('tracking', 'an existing part cannot change how it is tracked through an import');

    const out: ImportRow = {
      row,
      action: existing ? 'update' : 'create',
      partId: existing?.id,
      sku,
      category: cat ?? 'other',
      tracking: tracking ?? 'counted',
    };
    if (name) out.name = name;

    const specCols = header.filter((h) => h.startsWith('spec.'));
    if (cat && (specCols.length || !existing || catText)) {
      const given = Object.fromEntries(
        specCols.map((h) => [specKey(cat, h.slice(5)), specValue(cell(h) ?? '')]),
      );
      const merged = {
        ...(existing && existing.category === cat ? existing.specs : {}),
        ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== '')),
      };
      const specs = parseSpecs(cat, merged);
      if (specs.ok) out.specs = specs.specs;
      else for (const [field, messages] of Object.entries(specs.fields)) err(field, messages.join('; '));
    }

    const reorder = cell('reorder_point');
    if (reorder) {
      const n = wholeNumber(reorder);
      if (Number.isNaN(n)) err('reorder_point', 'reorder point is a whole number, 0 or more');
      else out.reorderPoint = n;
    }
    const price = cell('price');
    if (price !== undefined && price !== '') {
      const minor = parseMoney(price.replace(/^[^\d]+/, ''), ctx.currency);
      if (minor === null)
        err(
          'price',
          `price is an amount like 1.50 (${ctx.currency}, ${minorUnitExponent(ctx.currency)} decimals at most)`,
        );
      else out.priceMinor = minor;
    }
    for (const key of ['sellable', 'lendable'] as const) {
      const v = cell(key);
      if (v === undefined || v === '') continue;
      const b = bool(v);
      if (b === 'bad') err(key, `${key} is yes or no`);
      else out[key] = b;
    }
    if (out.sellable && out.priceMinor == null && !existing && !rowErrors.some((e) => e.field === 'price'))
      err('price', 'a part on sale needs a price');
    const saleUnit = cell('sale_unit');
    if (saleUnit) {
      const unit = parseMeasure(saleUnit);
      if (!unit) err('sale_unit', 'sale unit is each, metre or gram');
      else if (unit !== 'each' && tracking === 'unit') err('sale_unit', 'labelled units are always each');
      else out.saleUnit = unit;
    }
    const rowMeasure = out.saleUnit ?? measureOf(existing?.sale_unit);
    const notes = cell('notes');
    if (notes) out.notes = notes.slice(0, 2000);

    const qtyText = cell('qty');
    const loc = cell('location');
    if (qtyText) {
      const qty = parseQtyInput(qtyText) ?? NaN;
      const problem = Number.isNaN(qty) ? null : qtyProblem(qty, rowMeasure);
      if (Number.isNaN(qty)) err('qty', 'quantity is a number, 0 or more');
      else if (problem) err('qty', `quantity ${problem}`);
      else if (tracking === 'unit' && qty > 500) err('qty', 'at most 500 new units per row');
      else out.qty = qty;
      if (qty > 0 && !loc && tracking === 'counted') err('location', 'say which bin the stock goes in');
    }
    if (loc) {
      const id =
        ctx.locations.get(loc.toUpperCase().replace(/-/g, '')) ?? ctx.locations.get(loc.toLowerCase());
      if (!id) err('location', `no bin with the code or name "${loc}"`);
      else {
        out.locationId = id;
        out.locationLabel = loc;
      }
    }
    if (rowErrors.length) errors.push(...rowErrors);
    else rows.push(out);
  }
  if (total === 0 && !errors.length)
    errors.push({ row: 2, field: '(file)', message: 'the file has a header but no rows' });
  return { rows, errors, ignoredColumns, total };
}

/** Errors as API fields: `rows.<row>.<field>`. */
export function importFields(errors: RowError[]): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const e of errors) (fields[`rows.${e.row}.${e.field}`] ??= []).push(e.message);
  return fields;
}

export type ExportPart = {
  sku: string;
  name: string;
  category: string;
  tracking: string;
  code: string | null;
  onHand: number;
  unitsTotal: number;
  reorderPoint: number;
  priceMinor: number | null;
  saleUnit: string;
  sellable: boolean;
  lendable: boolean;
  keySpec: string;
  specs: Record<string, unknown>;
};

/** The parts table as CSV; `spec.*` columns hold every spec key any exported part has, so the file imports back. */
export function partsToCsv(parts: ExportPart[], currency: string): string {
  const exp = minorUnitExponent(currency);
  const specKeys = [...new Set(parts.flatMap((p) => Object.keys(p.specs)))].sort();
  const fields = [
    'sku',
    'name',
    'category',
    'tracking',
    'code',
    'on_hand',
    'units',
    'reorder_point',
    'price',
    'sale_unit',
    'sellable',
    'lendable',
    'key_spec',
    ...specKeys.map((k) => `spec.${k}`),
  ];
  const data = parts.map((p) =>
    [
      p.sku,
      p.name,
      p.category,
      p.tracking,
      p.code ?? '',
      p.onHand,
      p.tracking === 'unit' ? p.unitsTotal : '',
      p.reorderPoint,
      p.priceMinor === null ? '' : (p.priceMinor / 10 ** exp).toFixed(exp),
      p.saleUnit,
      p.sellable ? 'yes' : 'no',
      p.lendable ? 'yes' : 'no',
      p.keySpec,
      ...specKeys.map((k) =>
        p.specs[k] === undefined
          ? ''
          : typeof p.specs[k] === 'boolean'
            ? p.specs[k]
              ? 'yes'
              : 'no'
            : String(p.specs[k]),
      ),
    ],
  );
  return writeCsv(fields, data); // every cell guarded against spreadsheet formulas
}
