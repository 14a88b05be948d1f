'use client';
import { useState } from 'react';
import type { ImportCheck } from '@/lib/inventory/csv';
import { api, ApiError } from './api';
import { FormMessage } from './form-bits';
import { ScrollRegion } from './scroll-region';
import { TableHead } from './table-head';

/** A file download, not a page: a plain link with `download`, never a client-side navigation. */
const EXPORT_URL = '/api/parts/export';

const TEMPLATE = [
  'sku,name,category,tracking,reorder_point,price,sellable,location,qty,spec.vfMin,spec.vfTyp,spec.vfMax,spec.maxAmps,spec.maxWatts',
  'LED-2W-NW,2 W neutral white LED on 20 mm star,led,counted,10,1.20,yes,Bin A2 · LED stars,25,2.8,3.0,3.4,0.5,2',
].join('\r\n');

/** Upload → preview with every row's problems → import everything in one go, or nothing. */
export function ImportWizard() {
  const [csv, setCsv] = useState('');
  const [fileName, setFileName] = useState('');
  const [check, setCheck] = useState<ImportCheck | null>(null);
  const [message, setMessage] = useState<{ text: string; ok?: boolean; fields?: Record<string, string[]> }>({
    text: '',
  });
  const [busy, setBusy] = useState(false);

  async function preview(text: string) {
    setBusy(true);
    setMessage({ text: '' });
    try {
      setCheck(await api<ImportCheck>('/api/parts/import', { body: { csv: text } }));
    } catch (e) {
      setCheck(null);
      setMessage(
        e instanceof ApiError
          ? { text: e.message, fields: e.fields }
          : { text: 'Could not reach the server.' },
      );
    } finally {
      setBusy(false);
    }
  }

  async function commit() {
    setBusy(true);
    try {
      const r = await api<{ created: number; updated: number; received: number }>(
        '/api/parts/import?commit=1',
        { body: { csv } },
      );
      setMessage({
        text: `Imported: ${r.created} new parts, ${r.updated} updated, ${r.received} items received into bins.`,
        ok: true,
      });
      setCheck(null);
      setCsv('');
      setFileName('');
    } catch (e) {
      setMessage(
        e instanceof ApiError
          ? { text: e.message, fields: e.fields }
          : { text: 'Could not reach the server.' },
      );
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-4">
      <div className="card space-y-3">
        <div>
          <label htmlFor="csv-file" className="label">
            CSV file (UTF-8, first row = column names)
          </label>
          <input
            id="csv-file"
            type="file"
            accept=".csv,text/csv"
            className="field"
            onChange={async (e) => {
              const file = e.target.files?.[0];
              if (!file) return;
              const text = await file.text();
              setCsv(text);
              setFileName(file.name);
              await preview(text);
            }}
          />
        </div>
        <p className="muted text-sm">
          Columns: <code>sku</code> (required), <code>name</code>, <code>category</code>,{' '}
          <code>tracking</code> (counted or unit), <code>reorder_point</code>, <code>price</code>,{' '}
          <code>sellable</code>, <code>lendable</code>, <code>sale_unit</code> (each, metre or gram),{' '}
          <code>notes</code>, <code>location</code> (bin code or name), <code>qty</code> (metres and grams may
          have up to 3 decimals), and specs as{' '}
          <code>spec.&lt;field&gt;</code> (e.g. <code>spec.maxInputVolts</code>). An existing SKU updates that
          part and adds the quantity. Row numbers match your spreadsheet (the header is row 1).{' '}
          <a
            href={`data:text/csv;charset=utf-8,${encodeURIComponent(TEMPLATE)}`}
            download="parts-template.csv"
            className="underline"
          >
            Download a template
          </a>{' '}
          or{' '}
          <a href={EXPORT_URL} download className="underline">
            export the current parts
          </a>{' '}
          and edit that.
        </p>
      </div>
      <FormMessage message={message.text} fields={message.fields} ok={message.ok} />
      {check ? (
        <section className="card space-y-3" aria-labelledby="preview">
          <h2 id="preview" className="text-lg font-bold">
            Preview of {fileName || 'the file'}: {check.total} row{check.total === 1 ? '' : 's'}
          </h2>
          {check.ignoredColumns.length ? (
            <p className="text-sm">Columns not read: {check.ignoredColumns.join(', ')}.</p>
          ) : null}
          {check.errors.length ? (
            <div role="alert">
              <p className="font-semibold text-red-800 dark:text-red-300">
                {check.errors.length} problem{check.errors.length === 1 ? '' : 's'}: fix them in the file and
                upload it again. Nothing is imported while any row has a problem.
              </p>
              <table className="table-dense mt-2">
                <TableHead columns={['Row', 'Column', 'Problem']} />
                <tbody>
                  {check.errors.map((e, i) => (
                    <tr key={i}>
                      <td className="tabular-nums">{e.row}</td>
                      <td>
                        <code>{e.field}</code>
                      </td>
                      <td>{e.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          <ScrollRegion label="Rows to import">
            <table className="table-dense">
              <TableHead columns={['Row', 'Action', 'SKU', 'Name', 'Category', 'Quantity', 'Into']} />
              <tbody>
                {check.rows.map((r) => (
                  <tr key={r.row}>
                    <td className="tabular-nums">{r.row}</td>
                    <td>{r.action === 'create' ? 'new part' : 'update'}</td>
                    <td className="font-mono text-xs">{r.sku}</td>
                    <td>{r.name ?? <span className="muted">unchanged</span>}</td>
                    <td>{r.category}</td>
                    <td className="tabular-nums">{r.qty ?? '—'}</td>
                    <td>{r.locationLabel ?? '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
          <button
            type="button"
            className="btn-primary"
            disabled={busy || check.errors.length > 0 || check.rows.length === 0}
            onClick={commit}
          >
            Import {check.rows.length} row{check.rows.length === 1 ? '' : 's'}
          </button>
        </section>
      ) : null}
    </div>
  );
}
