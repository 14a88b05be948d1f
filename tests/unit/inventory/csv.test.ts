import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import {
  checkImport,
  importFields,
  partsToCsv,
  type ExistingPart,
  type ImportContext,
} from '@/lib/inventory/csv';

const BIN = '00000000-0000-4000-8000-000000000001';
const BIN_CODE = 'K7F2QX9';

function ctx(over: Partial<ImportContext> = {}): ImportContext {
  return {
    currency: 'USD',
    parts: new Map<string, ExistingPart>(),
    locations: new Map([
      [BIN_CODE, BIN],
      ['bin a2 · led stars', BIN],
    ]),
    ...over,
  };
}

const LED_HEAD =
  'sku,name,category,tracking,spec.vfMin,spec.vfTyp,spec.vfMax,spec.maxAmps,spec.maxWatts,location,qty';

describe('checkImport', () => {
  it('reads a good row into a new part with its specs and stock', () => {
    const r = checkImport(
      `${LED_HEAD}\nLED-X,Test LED,led,counted,2.8,3.0,3.4,0.35,1.2,${BIN_CODE},10\n`,
      ctx(),
    );
    expect(r.errors).toEqual([]);
    expect(r.rows).toHaveLength(1);
    expect(r.rows[0]).toMatchObject({
      row: 2,
      action: 'create',
      sku: 'LED-X',
      category: 'led',
      qty: 10,
      locationId: BIN,
      specs: { vfMin: 2.8, vfTyp: 3, vfMax: 3.4 },
    });
  });

  it('names the spreadsheet row and the field of each problem', () => {
    const csv = [
      'sku,name,category,tracking,spec.type,spec.minInputVolts,spec.maxInputVolts,spec.outputAmps,location,qty',
      'DRV-1,Good driver,driver,unit,buck,6,36,0.35,,',
      'DRV-2,Bad driver,driver,unit,buck,6,,0.35,,',
      'DRV-3,Wrong bin,driver,unit,buck,6,36,0.35,Nowhere,2',
    ].join('\n');
    const r = checkImport(csv, ctx());
    expect(r.errors).toEqual([
      { row: 3, field: 'specs.maxInputVolts', message: expect.stringContaining('required') },
      { row: 4, field: 'location', message: expect.stringContaining('Nowhere') },
    ]);
    expect(importFields(r.errors)).toHaveProperty(['rows.3.specs.maxInputVolts']);
    expect(r.rows.map((x) => x.sku)).toEqual(['DRV-1']);
  });

  it('keeps counting rows across blank lines and quoted line breaks', () => {
    const csv = 'sku,name,category\nA-1,"Two\nlines",consumable\n\nA-2,Fine,nope\n';
    const r = checkImport(csv, ctx());
    // Record 1 is the header; A-1 is record 2 (spanning two lines), the blank is 3, A-2 is 4.
    expect(r.errors).toEqual([
      { row: 4, field: 'category', message: expect.stringContaining('unknown category') },
    ]);
  });

  it('refuses a SKU repeated in the file, pointing at its first row', () => {
    const r = checkImport('sku,name,category\nS-1,One,tool\nS-1,Again,tool\n', ctx());
    expect(r.errors).toEqual([{ row: 3, field: 'sku', message: 'SKU S-1 appears again (first on row 2)' }]);
  });

  it('updates an existing SKU, keeping its other specs and tracking', () => {
    const existing: ExistingPart = {
      id: 'p1',
      sku: 'LED-X',
      category: 'led',
      tracking: 'counted',
      specs: { vfMin: 2.8, vfTyp: 3, vfMax: 3.4, maxAmps: 0.35, maxWatts: 1.2 },
    };
    const r = checkImport(
      'sku,spec.maxWatts,qty,location\nLED-X,1.5,4,bin a2 · led stars\n',
      ctx({ parts: new Map([['LED-X', existing]]) }),
    );
    expect(r.errors).toEqual([]);
    expect(r.rows[0]).toMatchObject({
      action: 'update',
      partId: 'p1',
      specs: { vfMin: 2.8, maxWatts: 1.5 },
      qty: 4,
    });
  });

  it('refuses changing an existing part between counted and labelled', () => {
    const existing: ExistingPart = { id: 'p1', sku: 'T-1', category: 'tool', tracking: 'unit', specs: {} };
    const r = checkImport('sku,tracking\nT-1,counted\n', ctx({ parts: new Map([['T-1', existing]]) }));
    expect(r.errors.map((e) => e.field)).toEqual(['tracking']);
  });

  it('reads prices in the currency’s minor units (ISO 4217: USD 2 decimals, JPY 0)', () => {
    // ISO 4217 minor units: USD exponent 2, JPY exponent 0.
    const usd = checkImport('sku,name,category,price,sellable\nC-1,Thing,consumable,1.50,yes\n', ctx());
    expect(usd.rows[0].priceMinor).toBe(150);
    const jpy = checkImport(
      'sku,name,category,price,sellable\nC-1,Thing,consumable,1.50,yes\n',
      ctx({ currency: 'JPY' }),
    );
    expect(jpy.errors.map((e) => e.field)).toEqual(['price']);
  });

  it('needs a sku column and at least one row', () => {
    expect(checkImport('name\nx\n', ctx()).errors[0]).toMatchObject({ row: 1, field: 'sku' });
    expect(checkImport('sku,name\n', ctx()).errors[0]).toMatchObject({ field: '(file)' });
  });
});

describe('partsToCsv', () => {
  const part = {
    sku: 'DRV-B350-36',
    name: '=HYPERLINK("x")',
    category: 'driver',
    tracking: 'unit',
    code: null,
    onHand: 3,
    unitsTotal: 4,
    reorderPoint: 0,
    priceMinor: 1250,
    saleUnit: 'each',
    sellable: true,
    lendable: true,
    keySpec: '350 mA · 6–36 V in',
    specs: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35, dimmable: true },
  };

  it('keeps a formula-looking cell as text (OWASP “CSV injection” guidance)', () => {
    const rows = Papa.parse<string[]>(partsToCsv([part], 'USD')).data;
    expect(rows[1][1]).toBe(`'=HYPERLINK("x")`);
    expect(rows[1][8]).toBe('12.50');
  });

  it('writes a file the import reads back to the same specs', () => {
    const back = checkImport(partsToCsv([{ ...part, name: 'Driver' }], 'USD'), ctx());
    expect(back.errors).toEqual([]);
    expect(back.rows[0]).toMatchObject({
      sku: 'DRV-B350-36',
      category: 'driver',
      tracking: 'unit',
      priceMinor: 1250,
      specs: part.specs,
    });
  });
});
