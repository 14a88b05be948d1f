'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { formatCode } from '@/labels/code';
import { callApi } from '@/components/loans/api';
import { ErrorNote } from '@/components/loans/error-note';

type Content = { partId: string; name: string; qty: number; unitId: string | null; unitCode: string | null };
type Choices = {
  bins: { id: string; name: string }[];
  spares: Record<string, { id: string; code: string }[]>;
};
type Destination = 'shelf' | 'repair' | 'retired';

const shown = (code: string) => {
  try {
    return formatCode(code);
  } catch {
    return code;
  }
};

// Looking after a box at the bench: take a unit or some of a counted part out, swap a unit for a spare
// of the same part, or take the whole box apart. Each is one call; the page refreshes with the result.
export function BoxUpkeep({
  boxId,
  contents,
  choices,
}: {
  boxId: string;
  contents: Content[];
  choices: Choices;
}) {
  const router = useRouter();
  const ids = useId();
  const [bin, setBin] = useState('');
  const [reason, setReason] = useState('');
  const [done, setDone] = useState('');
  const m = useMutation({
    mutationFn: (call: { url: string; body: Record<string, unknown>; say: string }) =>
      callApi(call.url, 'POST', {
        ...call.body,
        ...(bin ? { locationId: bin } : {}),
        ...(reason.trim() ? { reason: reason.trim() } : {}),
      }).then(() => call.say),
    onSuccess: (say) => {
      setDone(say);
      setReason('');
      router.refresh();
    },
  });

  return (
    <details className="card" open={false}>
      <summary className="cursor-pointer text-lg font-bold">Look after this box</summary>
      <div className="mt-3 space-y-3">
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label className="label" htmlFor={`${ids}-bin`}>
              Bin for what goes back on the shelf
            </label>
            <select id={`${ids}-bin`} className="field" value={bin} onChange={(e) => setBin(e.target.value)}>
              <option value="">Where it usually lives</option>
              {choices.bins.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.name}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor={`${ids}-why`}>
              Why (kept in the history)
            </label>
            <input
              id={`${ids}-why`}
              className="field"
              value={reason}
              maxLength={500}
              onChange={(e) => setReason(e.target.value)}
            />
          </div>
        </div>
        <ul className="divide-y divide-stone-200 dark:divide-stone-800">
          {contents.map((c) => (
            <ContentRow
              key={`${c.partId}:${c.unitId ?? ''}`}
              content={c}
              spares={choices.spares[c.partId] ?? []}
              busy={m.isPending}
              act={(body, say) => m.mutate({ url: `/api/kits/boxes/${boxId}/contents`, body, say })}
            />
          ))}
        </ul>
        <button
          type="button"
          className="btn-danger"
          disabled={m.isPending}
          onClick={() => {
            if (
              !window.confirm('Take the box apart? Everything goes back on the shelf and the box is retired.')
            )
              return;
            m.mutate({
              url: `/api/kits/boxes/${boxId}/take-apart`,
              body: {},
              say: 'The box is taken apart.',
            });
          }}
        >
          Take the box apart
        </button>
        <ErrorNote error={m.error} />
        {done && !m.error ? (
          <p role="status" className="text-sm">
            {done}
          </p>
        ) : null}
      </div>
    </details>
  );
}

function ContentRow({
  content: c,
  spares,
  busy,
  act,
}: {
  content: Content;
  spares: { id: string; code: string }[];
  busy: boolean;
  act: (body: Record<string, unknown>, say: string) => void;
}) {
  const ids = useId();
  const [to, setTo] = useState<Destination>('shelf');
  const [qty, setQty] = useState(1);
  const [spare, setSpare] = useState('');
  const what = c.unitCode ? `${c.name} ${shown(c.unitCode)}` : c.name;
  return (
    <li className="space-y-2 py-2">
      <p className="font-semibold">
        {c.qty > 1 ? `${c.qty} × ` : ''}
        {what}
      </p>
      <div className="flex flex-wrap items-end gap-2">
        <div>
          <label className="label" htmlFor={`${ids}-to`}>
            Where it goes
          </label>
          <select
            id={`${ids}-to`}
            className="field"
            value={to}
            onChange={(e) => setTo(e.target.value as Destination)}
          >
            <option value="shelf">Back on the shelf</option>
            <option value="repair">{c.unitId ? 'To repair' : 'Damaged (write off)'}</option>
            <option value="retired">{c.unitId ? 'Retired' : 'Lost (write off)'}</option>
          </select>
        </div>
        {c.unitId ? (
          <div>
            <label className="label" htmlFor={`${ids}-spare`}>
              Swap in
            </label>
            <select
              id={`${ids}-spare`}
              className="field"
              value={spare}
              onChange={(e) => setSpare(e.target.value)}
            >
              <option value="">Nothing (just take it out)</option>
              {spares.map((s) => (
                <option key={s.id} value={s.id}>
                  {shown(s.code)}
                </option>
              ))}
            </select>
          </div>
        ) : (
          <div>
            <label className="label" htmlFor={`${ids}-qty`}>
              How many
            </label>
            <input
              id={`${ids}-qty`}
              className="field w-24"
              type="number"
              min={1}
              max={c.qty}
              value={qty}
              onChange={(e) => setQty(Math.max(1, Math.min(c.qty, Number(e.target.value) || 1)))}
            />
          </div>
        )}
        <button
          type="button"
          className="btn-quiet"
          disabled={busy}
          aria-label={`${spare ? 'Swap' : 'Take out'} ${what}`}
          onClick={() =>
            c.unitId
              ? act(
                  { unitId: c.unitId, to, ...(spare ? { replacementUnitId: spare } : {}) },
                  spare ? `${what} swapped.` : `${what} taken out.`,
                )
              : act({ partId: c.partId, qty, to }, `${qty} × ${c.name} taken out.`)
          }
        >
          {spare ? 'Swap' : 'Take out'}
        </button>
      </div>
    </li>
  );
}
