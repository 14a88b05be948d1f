import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { checkOffersImport, offersToCsv, type OfferImportContext } from '@/lib/restock/offers-csv';

// The offers CSV, with the parts CSV's conventions: header row 1, SKU names the part, prices as decimals
// of the currency (ISO 4217: USD two digits, JPY none), yes/no flags, errors by row and field.

const ctx: OfferImportContext = {
  currency: 'USD',
  suppliers: new Map([
    ['wrenfold trading', 's-wren'],
    ['quayfold parts', 's-quay'],
  ]),
  parts: new Map([
    ['PAD-20', 'p-pad'],
    ['LEAD-22', 'p-lead'],
  ]),
};
const file = (...lines: string[]) => ['supplier,sku,part,their_ref,pack_size,pack_price,preferred', ...lines].join('\r\n');

describe('offers out', () => {
  it('writes decimals in the currency’s digits, yes/no, and guards cells a spreadsheet would run', () => {
    const csv = offersToCsv(
      [
        { supplier: 'Wrenfold Trading', sku: 'PAD-20', part: 'Star pads', itemRef: '=1+1', packSize: 10, packPriceMinor: 405, preferred: true },
        { supplier: 'Quayfold Parts', sku: 'LEAD-22', part: 'Twin lead', itemRef: 'QF-7', packSize: 25, packPriceMinor: 1000, preferred: false },
      ],
      'USD',
    );
    const rows = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data;
    expect(rows[0]).toEqual({ supplier: 'Wrenfold Trading', sku: 'PAD-20', part: 'Star pads', their_ref: "'=1+1", pack_size: '10', pack_price: '4.05', preferred: 'yes' });
    expect(rows[1]).toMatchObject({ pack_price: '10.00', preferred: 'no' });
    expect(offersToCsv([{ supplier: 'A', sku: 'B', part: 'C', itemRef: '', packSize: 1, packPriceMinor: 450, preferred: false }], 'JPY')).toContain(',450,');
  });

  it('reads its own file back to the same offers (the guard undone)', () => {
    const csv = offersToCsv([{ supplier: 'Wrenfold Trading', sku: 'PAD-20', part: 'Star pads', itemRef: '=1+1', packSize: 10, packPriceMinor: 405, preferred: true }], 'USD');
    const check = checkOffersImport(`\ufeff${csv}`, ctx);
    expect(check.errors).toEqual([]);
    expect(check.rows).toEqual([{ row: 2, supplierId: 's-wren', partId: 'p-pad', sku: 'PAD-20', itemRef: '=1+1', packSize: 10, packPriceMinor: 405, preferred: true }]);
  });
});

describe('offers in', () => {
  it('names every problem by row and field, and keeps only the good rows', () => {
    const check = checkOffersImport(
      file(
        'Wrenfold Trading,PAD-20,,WF-1,10,4.05,yes', // row 2: good
        'Nobody Ltd,PAD-20,,,10,4.05,no', // row 3: unknown supplier
        'quayfold parts,NOPE,,,10,4.05,no', // row 4: unknown SKU (supplier matched in any case)
        'Quayfold Parts,LEAD-22,,,0,4.055,maybe', // row 5: pack size, price digits, preferred
        'Wrenfold Trading,PAD-20,,,5,2.00,no', // row 6: the same offer again
        'Quayfold Parts,PAD-20,,,5,2.00,yes', // row 7: a second preferred offer for PAD-20
        'Wrenfold Trading,LEAD-22,,,25,,no', // row 8: no price
      ),
      ctx,
    );
    expect(check.rows.map((r) => r.row)).toEqual([2]);
    const at = (row: number) => check.errors.filter((e) => e.row === row).map((e) => e.field);
    expect(at(3)).toEqual(['supplier']);
    expect(at(4)).toEqual(['sku']);
    expect(at(5)).toEqual(['pack_size', 'pack_price', 'preferred']);
    expect(at(6)).toEqual(['sku']);
    expect(at(7)).toEqual(['preferred']);
    expect(at(8)).toEqual(['pack_price']);
    expect(check.errors.find((e) => e.row === 5 && e.field === 'pack_price')!.message).toContain('2 decimals at most');
    expect(check.total).toBe(7);
  });

  it('refuses a header without the columns it needs, and a file with no rows', () => {
    expect(checkOffersImport('supplier,sku\r\nA,B', ctx).errors.map((e) => [e.row, e.field])).toEqual([
      [1, 'pack_size'],
      [1, 'pack_price'],
    ]);
    expect(checkOffersImport(file(), ctx).errors.map((e) => e.message)).toEqual(['the file has no offers below its header']);
  });

  it('lists columns it does not know, and reads past the part name written for people', () => {
    const check = checkOffersImport('supplier,sku,part,pack_size,pack_price,colour\r\nWrenfold Trading,PAD-20,Star pads,10,4,red', ctx);
    expect(check.errors).toEqual([]);
    expect(check.ignoredColumns).toEqual(['colour']);
    expect(check.rows[0]).toMatchObject({ packPriceMinor: 400, preferred: false, itemRef: '' });
  });
});
