'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { FileText, Trash2 } from 'lucide-react';
import { ApiError, api } from './api';

type Attachment = { id: string; filename: string; mime: string; sizeBytes: number };

const size = (n: number) =>
  n < 1024 * 1024 ? `${Math.ceil(n / 1024)} kB` : `${(n / 1024 / 1024).toFixed(1)} MB`;

/** Datasheets and photos of a part: photos shown small, PDFs as download links; stewards upload and remove. */
export function AttachmentsPanel({
  partId,
  attachments,
  canWrite,
}: {
  partId: string;
  attachments: Attachment[];
  canWrite: boolean;
}) {
  const router = useRouter();
  const [message, setMessage] = useState('');
  const [busy, setBusy] = useState(false);

  async function upload(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const form = new FormData(formEl);
    form.set('partId', partId);
    setBusy(true);
    setMessage('');
    const res = await fetch('/api/attachments', { method: 'POST', body: form }).catch(() => null);
    setBusy(false);
    if (!res) return setMessage('Could not reach the server.');
    if (!res.ok) {
      const body = await res.json().catch(() => null);
      return setMessage(
        body?.error?.fields?.file?.join('; ') ?? body?.error?.message ?? `Upload refused (${res.status}).`,
      );
    }
    formEl.reset();
    setMessage('Uploaded.');
    router.refresh();
  }

  async function remove(a: Attachment) {
    if (!window.confirm(`Remove ${a.filename}?`)) return;
    try {
      await api(`/api/attachments/${a.id}`, { method: 'DELETE' });
      router.refresh();
    } catch (err) {
      setMessage(err instanceof ApiError ? err.message : 'Could not reach the server.');
    }
  }

  return (
    <div className="space-y-3">
      {attachments.length === 0 ? <p className="muted text-sm">No datasheets or photos yet.</p> : null}
      <ul className="grid gap-3 sm:grid-cols-3">
        {attachments.map((a) => (
          <li key={a.id} className="rounded-lg border border-stone-200 p-2 dark:border-stone-700">
            {a.mime.startsWith('image/') ? (
              // eslint-disable-next-line @next/next/no-img-element -- stored bytes served by our own route, sized by CSS
              <img
                src={`/api/attachments/${a.id}`}
                alt={`Photo: ${a.filename}`}
                className="mb-2 h-32 w-full rounded object-contain"
                loading="lazy"
              />
            ) : (
              <FileText aria-hidden className="mb-2 size-8" />
            )}
            <a href={`/api/attachments/${a.id}`} className="break-all">
              {a.filename}
            </a>
            <span className="muted text-xs"> · {size(a.sizeBytes)}</span>
            {canWrite ? (
              <button type="button" className="btn-quiet mt-2 w-full" onClick={() => remove(a)}>
                <Trash2 aria-hidden className="size-4" /> Remove
              </button>
            ) : null}
          </li>
        ))}
      </ul>
      {canWrite ? (
        <form onSubmit={upload} className="flex flex-wrap items-end gap-2">
          <div>
            <label htmlFor="attachment-file" className="label">
              Add a datasheet (PDF) or photo (JPEG, PNG, WebP), up to 5 MB
            </label>
            <input
              id="attachment-file"
              name="file"
              type="file"
              accept="application/pdf,image/jpeg,image/png,image/webp"
              className="field"
              required
            />
          </div>
          <button type="submit" className="btn-quiet" disabled={busy}>
            {busy ? 'Uploading…' : 'Upload'}
          </button>
        </form>
      ) : null}
      <p role="status" className="text-sm">
        {message}
      </p>
    </div>
  );
}
