// CSV in and out for supplier offers, beside the parts CSV and with its conventions (lib/inventory/csv.ts):
// a header row, `sku` names the part, prices as decimals of the space's currency (ISO 4217 minor digits),
// yes/no flags, every cell written through writeCsv and read back unguarded; row numbers are the
// spreadsheet's (the header is row 1); errors are `rows.<row>.<field>`. Pure (papaparse + zod), so the
// preview and the commit check rows by the very same rules.
import Papa from 'papaparse';
import { qtyProblem, type Measure } from '@/lib/inventory/measure';
import { csvUnguard, writeCsv } from '@/lib/csv';
import { minorUnitExponent, parseMoney } from '@/lib/money';
import type { RowError } from '@/lib/inventory/csv';
import { offerSchema } from './schemas';

export const MAX_OFFER_ROWS = 2000;
const COLUMNS = ['supplier', 'sku', 'part', 'their_ref', 'pack_size', 'pack_price', 'preferred'] as const;
/** Written for people reading the file; the import reads past it (the SKU names the part). */
const EXPORT_ONLY = new Set(['part']);

export type ExportOffer = {
  supplier: string;
  sku: string;
  part: string;
  itemRef: string;
  packSize: number;
  packPriceMinor: number;
  preferred: boolean;
};

export function offersToCsv(offers: ExportOffer[], currency: string): string {
  const exp = minorUnitExponent(currency);
  return writeCsv(
    COLUMNS,
    offers.map((o) => ({
      supplier: o.supplier,
      sku: o.sku,
      part: o.part,
      their_ref: o.itemRef,
      pack_size: o.packSize,
      pack_price: (o.packPriceMinor / 10 ** exp).toFixed(exp),
      preferred: o.preferred ? 'yes' : 'no',
    })),
  );
}

export type OfferImportContext = {
  currency: string;
  /** Supplier ids by lower-case name. */
  suppliers: Map<string, string>;
  /** Part ids by SKU, exactly as stored. */
  parts: Map<string, string>;
  /** Each part's unit by part id (migration 0014): a pack of whole items is a whole number. */
  units?: Map<string, Measure>;
};
export type OfferImportRow = {
  row: number;
  supplierId: string;
  partId: string;
  sku: string;
  itemRef: string;
  packSize: number;
  packPriceMinor: number;
  preferred: boolean;
};
export type OfferImportCheck = { rows: OfferImportRow[]; errors: RowError[]; ignoredColumns: string[]; total: number };

const headerKey = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, '_');
const YES = new Set(['yes', 'y', 'true', '1', 'x']);
const NO = new Set(['no', 'n', 'false', '0', '']);
const firstMessage = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues[0]?.message ?? 'not valid';

/** Checks every row against the space's suppliers and parts; nothing is written. */
export function checkOffersImport(csv: string, ctx: OfferImportContext): OfferImportCheck {
  const parsed = Papa.parse<string[]>(csv.replace(/^\ufeff/, ''), { skipEmptyLines: false });
  const records = parsed.data;
  const errors: RowError[] = parsed.errors
    .filter((e) => e.type !== 'Delimiter')
    .map((e) => ({ row: (e.row ?? 0) + 1, field: '(file)', message: e.message }));
  const header = (records[0] ?? []).map(headerKey);
  for (const need of ['supplier', 'sku', 'pack_size', 'pack_price'])
    if (!header.includes(need)) errors.push({ row: 1, field: need, message: `the header row needs a "${need}" column` });
  const known = new Set<string>(COLUMNS);
  const ignoredColumns = header.filter((h) => h && !known.has(h) && !EXPORT_ONLY.has(h));
  const rows: OfferImportRow[] = [];
  const seen = new Map<string, number>();
  const preferredRow = new Map<string, number>();
  let total = 0;
  if (errors.some((e) => e.row === 1)) return { rows, errors, ignoredColumns, total };

  for (let i = 1; i < records.length; i++) {
    const rec = records[i];
    if (rec.every((c) => c.trim() === '')) continue;
    total++;
    const row = i + 1;
    if (total > MAX_OFFER_ROWS) {
      errors.push({ row, field: '(file)', message: `at most ${MAX_OFFER_ROWS} rows per import` });
      break;
    }
    const cell = (k: string) => {
      const j = header.indexOf(k);
      return j < 0 ? '' : csvUnguard((rec[j] ?? '').trim());
    };
    const rowErrors: RowError[] = [];
    const err = (field: string, message: string) => rowErrors.push({ row, field, message });

    const supplierName = cell('supplier');
    const supplierId = ctx.suppliers.get(supplierName.toLowerCase());
    if (!supplierName) err('supplier', 'supplier is required');
    else if (!supplierId) err('supplier', `no supplier called “${supplierName}” here; add it on the Suppliers page first`);

    const sku = cell('sku');
    const partId = ctx.parts.get(sku);
    if (!sku) err('sku', 'SKU is required');
    else if (!partId) err('sku', `no part with SKU ${sku} here`);

    if (supplierId && partId) {
      const key = `${supplierId}:${partId}`;
      if (seen.has(key)) err('sku', `this supplier’s offer for ${sku} appears again (first on row ${seen.get(key)})`);
      else seen.set(key, row);
    }

    const itemRef = offerSchema.shape.itemRef.safeParse(cell('their_ref'));
    if (!itemRef.success) err('their_ref', firstMessage(itemRef));

    const sizeText = cell('pack_size');
    const packSize = offerSchema.shape.packSize.safeParse(sizeText === '' ? undefined : Number(sizeText));
    if (!sizeText) err('pack_size', 'pack size is required');
    else if (!packSize.success) err('pack_size', firstMessage(packSize));
    else if (partId && ctx.units) {
      const problem = qtyProblem(packSize.data, ctx.units.get(partId) ?? 'each');
      if (problem) err('pack_size', `pack size ${problem}`);
    }

    const priceText = cell('pack_price');
    const minor = priceText ? parseMoney(priceText.replace(/^[^\d]+/, ''), ctx.currency) : null;
    const packPrice = offerSchema.shape.packPriceMinor.safeParse(minor ?? undefined);
    if (!priceText) err('pack_price', 'price per pack is required');
    else if (minor === null)
      err('pack_price', `price per pack is an amount like 4.50 (${ctx.currency}, ${minorUnitExponent(ctx.currency)} decimals at most)`);
    else if (!packPrice.success) err('pack_price', firstMessage(packPrice));

    const prefText = cell('preferred').toLowerCase();
    const preferred = YES.has(prefText) ? true : NO.has(prefText) ? false : null;
    if (preferred === null) err('preferred', 'preferred is yes or no');
    else if (preferred && partId) {
      if (preferredRow.has(partId)) err('preferred', `${sku} is already ordered from another supplier on row ${preferredRow.get(partId)}`);
      else preferredRow.set(partId, row);
    }

    if (rowErrors.length) errors.push(...rowErrors);
    else
      rows.push({
        row,
        supplierId: supplierId!,
        partId: partId!,
        sku,
        itemRef: itemRef.data!,
        packSize: packSize.data!,
        packPriceMinor: packPrice.data!,
        preferred: preferred!,
      });
  }
  if (total === 0 && !errors.length) errors.push({ row: 2, field: '(file)', message: 'the file has no offers below its header' });
  return { rows, errors, ignoredColumns, total };
}
