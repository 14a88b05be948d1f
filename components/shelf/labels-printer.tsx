'use client';
import { useState } from 'react';
import type { LabelSelection } from '@/lib/inventory/schemas';
import { ApiError, type FieldErrors } from './api';
import { FormMessage } from './form-bits';
import { saveBlob, streamLabelsPdf } from './label-print';
import { LabelProgress } from './label-progress';
import { LayoutSelect } from './layout-select';
import { PartPicker, type PickedPart } from './part-picker';

type Kind = LabelSelection['kind'];

/** Print from a selection: a part's units, a bin and its contents, a list of codes, or everything added today. */
export function LabelsPrinter({
  layouts,
  defaultLayout,
  locations,
  todayCount,
}: {
  layouts: { id: string; name: string; perPage: number }[];
  defaultLayout: string;
  locations: { id: string; name: string }[];
  /** Labels issued today in this space, so the size of that run is known before it is made. */
  todayCount: number;
}) {
  const [kind, setKind] = useState<Kind>('today');
  const [part, setPart] = useState<PickedPart | null>(null);
  const [locationId, setLocationId] = useState(locations[0]?.id ?? '');
  const [codes, setCodes] = useState('');
  const [layoutId, setLayoutId] = useState(defaultLayout);
  const [skipSlots, setSkipSlots] = useState(0);
  const [outline, setOutline] = useState(false);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const [result, setResult] = useState<{ message: string; ok?: boolean; fields?: FieldErrors }>({
    message: '',
  });
  const [busy, setBusy] = useState(false);
  const [url, setUrl] = useState<string | null>(null);

  function selection(): LabelSelection | null {
    switch (kind) {
      case 'part':
        return part ? { kind, partId: part.id, includePart: true } : null;
      case 'location':
        return locationId ? { kind, locationId, contents: true } : null;
      case 'codes':
        return { kind, codes: codes.split(/[\s,;]+/).filter(Boolean) };
      case 'today':
        return { kind };
    }
  }

  async function print(e: React.FormEvent) {
    e.preventDefault();
    const sel = selection();
    if (!sel) return setResult({ message: kind === 'part' ? 'Choose a part first.' : 'Choose a bin first.' });
    setBusy(true);
    setResult({ message: '' });
    setProgress({ done: 0, total: 0 });
    try {
      const { blob, count } = await streamLabelsPdf(
        { selection: sel, layoutId, skipSlots, outline },
        (done, total) => setProgress({ done, total }),
      );
      if (url) URL.revokeObjectURL(url);
      setUrl(saveBlob(blob, 'labels.pdf'));
      setResult({
        message: `${count} label${count === 1 ? '' : 's'} ready. Print at 100 % (turn off “fit to page”).`,
        ok: true,
      });
    } catch (err) {
      setProgress(null);
      setResult(
        err instanceof ApiError
          ? { message: err.message, fields: err.fields }
          : { message: 'Could not reach the server.' },
      );
    } finally {
      setBusy(false);
    }
  }

  const perPage = layouts.find((l) => l.id === layoutId)?.perPage ?? 1;
  const pagesFor = (n: number) => Math.ceil((n + skipSlots) / perPage);
  const KINDS: [Kind, string][] = [
    ['today', 'Everything added today'],
    ['part', 'A part and its units'],
    ['location', 'A bin and what is in it'],
    ['codes', 'A list of codes'],
  ];
  return (
    <form onSubmit={print} className="space-y-4">
      <fieldset className="card">
        <legend className="px-1 font-bold">What to print</legend>
        <div className="flex flex-wrap gap-4">
          {KINDS.map(([k, label]) => (
            <label key={k} className="flex min-h-11 items-center gap-2">
              <input
                type="radio"
                name="kind"
                className="size-5"
                checked={kind === k}
                onChange={() => setKind(k)}
              />{' '}
              {label}
            </label>
          ))}
        </div>
        <div className="mt-3">
          {kind === 'today' ? (
            <p role="status" className="text-sm">
              {todayCount === 0
                ? 'Nothing has been labelled today yet.'
                : `${todayCount} label${todayCount === 1 ? '' : 's'} on ${pagesFor(todayCount)} page${pagesFor(todayCount) === 1 ? '' : 's'} of this sheet${skipSlots ? ` (skipping ${skipSlots} used)` : ''}.`}
            </p>
          ) : null}
          {kind === 'part' ? (
            <>
              <label className="label" htmlFor="label-part">
                Part
              </label>
              <PartPicker id="label-part" value={part} onChange={setPart} />
            </>
          ) : null}
          {kind === 'location' ? (
            <>
              <label className="label" htmlFor="label-bin">
                Bin
              </label>
              <select
                id="label-bin"
                className="field"
                value={locationId}
                onChange={(e) => setLocationId(e.target.value)}
              >
                {locations.map((l) => (
                  <option key={l.id} value={l.id}>
                    {l.name}
                  </option>
                ))}
              </select>
            </>
          ) : null}
          {kind === 'codes' ? (
            <>
              <label className="label" htmlFor="label-codes">
                Codes (one per line, or separated by spaces)
              </label>
              <textarea
                id="label-codes"
                rows={4}
                className="field font-mono"
                value={codes}
                onChange={(e) => setCodes(e.target.value)}
              />
            </>
          ) : null}
        </div>
      </fieldset>
      <fieldset className="card grid gap-4 sm:grid-cols-3">
        <legend className="px-1 font-bold">Sheet</legend>
        <LayoutSelect layouts={layouts} value={layoutId} onChange={setLayoutId} />
        <div>
          <label className="label" htmlFor="skip">
            Labels already used on the first sheet
          </label>
          <input
            id="skip"
            type="number"
            min={0}
            max={Math.max(0, perPage - 1)}
            className="field"
            value={skipSlots}
            onChange={(e) => setSkipSlots(Number(e.target.value) || 0)}
          />
        </div>
        <label className="flex min-h-11 items-center gap-2 self-end">
          <input
            type="checkbox"
            className="size-5"
            checked={outline}
            onChange={(e) => setOutline(e.target.checked)}
          />{' '}
          Outline each label (test print on plain paper)
        </label>
      </fieldset>
      {/* Refused codes are named in the message itself; the field paths stay out of sight. */}
      <FormMessage
        message={result.message}
        fields={result.fields}
        shown={Object.keys(result.fields ?? {}).filter((k) => k.startsWith('selection.codes'))}
        ok={result.ok}
      />
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? 'Laying out…' : 'Make the label PDF'}
        </button>
        {url ? (
          <a href={url} download="labels.pdf">
            Download again
          </a>
        ) : null}
      </div>
      {progress ? <LabelProgress done={progress.done} total={progress.total} /> : null}
    </form>
  );
}
