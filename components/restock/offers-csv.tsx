'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError, callApi } from '@/components/ui/api';
import { FormMessage } from '@/components/shelf/form-bits';
import { CARD_TABLE } from '@/components/ui/card-table';
import type { OfferImportCheck } from '@/lib/restock/offers-csv';

/** Offers as CSV, beside the parts CSV: export them, or upload a file → preview its problems → import all or nothing. */
export function OffersCsv() {
  const router = useRouter();
  const [csv, setCsv] = useState('');
  const [check, setCheck] = useState<OfferImportCheck | null>(null);
  const [message, setMessage] = useState<{ text: string; ok?: boolean; fields?: Record<string, string[]> }>({ text: '' });
  const [busy, setBusy] = useState(false);

  const failed = (e: unknown) =>
    setMessage(e instanceof ApiError ? { text: e.message, fields: e.fields } : { text: 'Could not reach the server.' });

  async function preview(text: string) {
    setBusy(true);
    setMessage({ text: '' });
    try {
      setCheck(await callApi<OfferImportCheck>('/api/suppliers/offers/import', 'POST', { csv: text }));
    } catch (e) {
      setCheck(null);
      failed(e);
    } finally {
      setBusy(false);
    }
  }

  async function commit() {
    setBusy(true);
    try {
      const r = await callApi<{ added: number; replaced: number }>('/api/suppliers/offers/import?commit=1', 'POST', { csv });
      setMessage({ text: `Imported: ${r.added} new offers, ${r.replaced} replaced.`, ok: true });
      setCheck(null);
      setCsv('');
      router.refresh();
    } catch (e) {
      failed(e);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card space-y-3" aria-labelledby="offers-csv">
      <h2 id="offers-csv" className="text-lg font-bold">
        Offers as a CSV file
      </h2>
      <p className="muted text-sm">
        Columns: <code>supplier</code> (its name here), <code>sku</code>, <code>their_ref</code>, <code>pack_size</code>,{' '}
        <code>pack_price</code> (like 4.50), <code>preferred</code> (yes or no). A supplier’s offer for a part that already
        exists is replaced. Row numbers match your spreadsheet (the header is row 1).{' '}
        <a href="/api/suppliers/offers/export" download className="underline">
          Export the current offers
        </a>{' '}
        and edit that.
      </p>
      <div>
        <label htmlFor="offers-file" className="label">
          CSV file of offers
        </label>
        <input
          id="offers-file"
          type="file"
          accept=".csv,text/csv"
          className="field"
          onChange={async (e) => {
            const file = e.target.files?.[0];
            if (!file) return;
            const text = await file.text();
            setCsv(text);
            await preview(text);
          }}
        />
      </div>
      <FormMessage message={message.text} fields={message.fields} ok={message.ok} />
      {check ? (
        <div className="space-y-2">
          <p className="font-semibold">
            {check.total} row{check.total === 1 ? '' : 's'} read
            {check.ignoredColumns.length ? `; columns not read: ${check.ignoredColumns.join(', ')}` : ''}.
          </p>
          {check.errors.length ? (
            <div role="alert">
              <p className="font-semibold text-red-800 dark:text-red-300">
                {`${check.errors.length} problem${check.errors.length === 1 ? '' : 's'}: fix them in the file and upload it again. Nothing is imported while any row has a problem.`}
              </p>
              <table className={`mt-2 w-full ${CARD_TABLE}`}>
                <thead>
                  <tr>
                    <th scope="col">Row</th>
                    <th scope="col">Column</th>
                    <th scope="col">Problem</th>
                  </tr>
                </thead>
                <tbody>
                  {check.errors.map((e, i) => (
                    <tr key={i}>
                      <td data-label="Row" className="tabular-nums">
                        {e.row}
                      </td>
                      <td data-label="Column">
                        <code>{e.field}</code>
                      </td>
                      <td data-label="Problem">{e.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          <button
            type="button"
            className="btn-primary"
            disabled={busy || check.errors.length > 0 || check.rows.length === 0}
            onClick={commit}
          >
            {`Import ${check.rows.length} offer${check.rows.length === 1 ? '' : 's'}`}
          </button>
        </div>
      ) : null}
    </section>
  );
}
