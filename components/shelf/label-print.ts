'use client';
import type { LabelSelection } from '@/lib/inventory/schemas';
import { ApiError } from './api';

export type PrintRequest = {
  selection: LabelSelection;
  layoutId?: string;
  skipSlots?: number;
  outline?: boolean;
};

async function failed(res: Response): Promise<never> {
  const body = await res.json().catch(() => null);
  throw new ApiError(
    res.status,
    body?.error?.message ?? `The server answered ${res.status}.`,
    body?.error?.fields ?? {},
  );
}

/** Small runs: the PDF itself. */
export async function fetchLabelsPdf(req: PrintRequest): Promise<{ blob: Blob; count: number }> {
  const res = await fetch('/api/labels', {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/pdf' },
    body: JSON.stringify(req),
  });
  if (!res.ok) return failed(res);
  return { blob: await res.blob(), count: Number(res.headers.get('x-label-count') ?? 0) };
}

/** Large runs: progress lines while the server lays out pages, then the PDF (base64) at the end. */
export async function streamLabelsPdf(
  req: PrintRequest,
  onProgress: (done: number, total: number) => void,
): Promise<{ blob: Blob; count: number }> {
  const res = await fetch('/api/labels', {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/x-ndjson' },
    body: JSON.stringify(req),
  });
  if (!res.ok || !res.body) return failed(res);
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  let total = 0;
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffer += value;
    let nl: number;
    while ((nl = buffer.indexOf('\n')) >= 0) {
      const line = buffer.slice(0, nl);
      buffer = buffer.slice(nl + 1);
      if (!line.trim()) continue;
      const msg = JSON.parse(line) as {
        done?: number;
        total?: number;
        pdf?: string;
        error?: { message: string };
      };
      if (msg.error) throw new ApiError(400, msg.error.message);
      if (msg.total !== undefined) total = msg.total;
      if (msg.done !== undefined) onProgress(msg.done, total);
      if (msg.pdf) {
        const bytes = Uint8Array.from(atob(msg.pdf), (c) => c.charCodeAt(0));
        return { blob: new Blob([bytes], { type: 'application/pdf' }), count: total };
      }
    }
    if (done) throw new ApiError(502, 'The label run stopped before the PDF arrived; try again.');
  }
}

/** Hands a finished PDF to the browser as a download. */
export function saveBlob(blob: Blob, filename: string): string {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  return url;
}
