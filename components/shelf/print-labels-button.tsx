'use client';
import { useState } from 'react';
import { Printer } from 'lucide-react';
import type { LabelSelection } from '@/lib/inventory/schemas';
import { ApiError } from './api';
import { fetchLabelsPdf, saveBlob, streamLabelsPdf } from './label-print';
import { LabelProgress } from './label-progress';
import { LayoutSelect } from './layout-select';

/** One button that prints a selection's labels; runs above `streamAbove` labels show a progress bar. */
export function PrintLabelsButton({
  selection,
  expected,
  layouts,
  defaultLayout,
  label = 'Print labels',
  streamAbove = 100,
}: {
  selection: LabelSelection;
  expected: number;
  layouts: { id: string; name: string }[];
  defaultLayout: string;
  label?: string;
  streamAbove?: number;
}) {
  const [layoutId, setLayoutId] = useState(defaultLayout);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const [message, setMessage] = useState('');
  const [busy, setBusy] = useState(false);
  const [url, setUrl] = useState<string | null>(null);

  async function print() {
    setBusy(true);
    setMessage('');
    setProgress(null);
    try {
      const req = { selection, layoutId };
      const { blob, count } =
        expected > streamAbove
          ? await streamLabelsPdf(req, (done, total) => setProgress({ done, total }))
          : await fetchLabelsPdf(req);
      if (url) URL.revokeObjectURL(url);
      setUrl(saveBlob(blob, 'labels.pdf'));
      setMessage(
        `${count || expected} label${(count || expected) === 1 ? '' : 's'} ready: print at 100 % (no “fit to page”).`,
      );
    } catch (e) {
      setMessage(e instanceof ApiError ? e.message : 'Could not reach the server.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-wrap items-end gap-2">
      <LayoutSelect layouts={layouts} value={layoutId} onChange={setLayoutId} className="field w-auto" />
      <button type="button" className="btn-primary" onClick={print} disabled={busy}>
        <Printer aria-hidden className="size-4" /> {busy ? 'Preparing…' : label}
      </button>
      {progress ? <LabelProgress done={progress.done} total={progress.total} /> : null}
      <p role="status" className="w-full text-sm">
        {message}{' '}
        {url ? (
          <a href={url} download="labels.pdf">
            Download again
          </a>
        ) : null}
      </p>
    </div>
  );
}
