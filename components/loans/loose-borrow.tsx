'use client';
import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { looseNormalize, verifyCode } from '@/labels/code';
import type { DriverSpec, SupplySpec } from '@/lib/electrical';
import type { Preview } from '@/lib/loans/preview';
import type { LoosePick } from '@/lib/loans/queries';
import { Cautions } from '@/components/kits/cautions';
import { CheckReport } from '@/components/kits/check-report';
import { Alternatives } from './alternatives';
import { callApi } from './api';
import { BorrowPanel } from './borrow-panel';
import { formatMoney } from '@/lib/money';
import { ErrorNote } from './error-note';
import { OwnLeds, type OwnLedsValue } from './own-leds';
import { OwnDriver, OwnSupply } from './own-supply-driver';
import { displayCode } from '@/labels/code';

type Counted = { partId: string; locationId: string; qty: number };
type PreviewJson = Omit<Preview, 'dueAt'> & { dueAt: string };

// Borrowing loose parts (a supply, a driver, a bag of LEDs): scan or type each label, add counted
// parts from their bins, then check the chain on exactly those parts before borrowing.
export function LooseBorrow({
  pick,
  staff,
  members,
  userId,
}: {
  pick: LoosePick;
  staff: boolean;
  members: { id: string; name: string }[];
  userId: string;
}) {
  const ids = useId();
  const [code, setCode] = useState('');
  const [codeError, setCodeError] = useState<string | null>(null);
  const [unitIds, setUnitIds] = useState<string[]>([]);
  const [counted, setCounted] = useState<Counted[]>([]);
  const [partId, setPartId] = useState('');
  const [bin, setBin] = useState('');
  const [qty, setQty] = useState(1);
  const [ownLeds, setOwnLeds] = useState<OwnLedsValue | null>(null);
  // A steward lending chooses the borrower first: the check covers that person's whole build.
  const [borrowerId, setBorrowerId] = useState(userId);
  const [ownSupply, setOwnSupply] = useState<SupplySpec | null>(null);
  const [ownDriver, setOwnDriver] = useState<DriverSpec | null>(null);
  const ownParts =
    ownLeds || ownSupply || ownDriver
      ? {
          ...(ownSupply ? { supply: ownSupply } : {}),
          ...(ownDriver ? { driver: ownDriver } : {}),
          ...(ownLeds ? { string: ownLeds } : {}),
        }
      : undefined;
  const preview = useMutation({
    mutationFn: () =>
      callApi<{ preview: PreviewJson }>('/api/loans/preview', 'POST', {
        unitIds,
        counted,
        ...(ownParts ? { ownParts } : {}),
        ...(borrowerId !== userId ? { borrowerId } : {}),
      }),
  });
  const reset = () => preview.reset();

  const addCode = () => {
    const checked = verifyCode(code);
    const normal = checked.ok ? checked.code : looseNormalize(code);
    const unit = pick.units.find((u) => u.code === normal);
    if (!checked.ok) return setCodeError(checked.message);
    if (!unit) return setCodeError('No free unit on the shelf has that label.');
    if (!unitIds.includes(unit.id)) setUnitIds([...unitIds, unit.id]);
    setCode('');
    setCodeError(null);
    reset();
  };
  const part = pick.counted.find((c) => c.partId === partId);
  const p = preview.data?.preview;

  return (
    <div className="space-y-4">
      <section aria-labelledby={`${ids}-u`} className="card space-y-3">
        <h2 id={`${ids}-u`} className="text-lg font-bold">
          Labelled units
        </h2>
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            addCode();
          }}
        >
          <div className="grow">
            <label className="label" htmlFor={`${ids}-code`}>
              Label code
            </label>
            <input
              id={`${ids}-code`}
              className="field font-mono uppercase"
              autoComplete="off"
              value={code}
              onChange={(e) => setCode(e.target.value)}
            />
          </div>
          <button type="submit" className="btn-quiet">
            Add
          </button>
        </form>
        {codeError ? (
          <p role="alert" className="text-sm text-red-800 dark:text-red-300">
            {codeError}
          </p>
        ) : null}
        <ul className="space-y-1">
          {unitIds.map((id) => {
            const u = pick.units.find((x) => x.id === id)!;
            return (
              <Picked
                key={id}
                label={u.name}
                detail={displayCode(u.code)}
                onRemove={() => {
                  setUnitIds(unitIds.filter((x) => x !== id));
                  reset();
                }}
              />
            );
          })}
        </ul>
      </section>

      <section aria-labelledby={`${ids}-c`} className="card space-y-3">
        <h2 id={`${ids}-c`} className="text-lg font-bold">
          Counted parts
        </h2>
        <div className="grid gap-2 sm:grid-cols-[1fr_1fr_6rem_auto] sm:items-end">
          <div>
            <label className="label" htmlFor={`${ids}-part`}>
              Part
            </label>
            <select
              id={`${ids}-part`}
              className="field"
              value={partId}
              onChange={(e) => {
                setPartId(e.target.value);
                setBin(pick.counted.find((c) => c.partId === e.target.value)?.bins[0]?.locationId ?? '');
              }}
            >
              <option value="">Choose…</option>
              {pick.counted.map((c) => (
                <option key={c.partId} value={c.partId}>
                  {c.name}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor={`${ids}-bin`}>
              From
            </label>
            <select id={`${ids}-bin`} className="field" value={bin} onChange={(e) => setBin(e.target.value)}>
              {(part?.bins ?? []).map((b) => (
                <option key={b.locationId} value={b.locationId}>
                  {b.name} ({b.qty})
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor={`${ids}-qty`}>
              Qty
            </label>
            <input
              id={`${ids}-qty`}
              className="field"
              type="number"
              min={1}
              value={qty}
              onChange={(e) => setQty(Math.max(1, Number(e.target.value)))}
            />
          </div>
          <button
            type="button"
            className="btn-quiet"
            disabled={!partId || !bin}
            onClick={() => {
              setCounted([
                ...counted.filter((c) => !(c.partId === partId && c.locationId === bin)),
                { partId, locationId: bin, qty },
              ]);
              reset();
            }}
          >
            Add
          </button>
        </div>
        <ul className="space-y-1">
          {counted.map((c) => {
            const cp = pick.counted.find((x) => x.partId === c.partId)!;
            return (
              <Picked
                key={`${c.partId}:${c.locationId}`}
                label={`${c.qty} × ${cp.name}`}
                detail={cp.bins.find((b) => b.locationId === c.locationId)?.name ?? ''}
                onRemove={() => {
                  setCounted(counted.filter((x) => x !== c));
                  reset();
                }}
              />
            );
          })}
        </ul>
      </section>

      {staff && members.length ? (
        <section aria-labelledby={`${ids}-w`} className="card space-y-2">
          <h2 id={`${ids}-w`} className="text-lg font-bold">
            Borrower
          </h2>
          <label className="label" htmlFor={`${ids}-who`}>
            Lend to
          </label>
          <select
            id={`${ids}-who`}
            className="field"
            value={borrowerId}
            onChange={(e) => {
              setBorrowerId(e.target.value);
              reset();
            }}
          >
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.id === userId ? `${m.name} (me)` : m.name}
              </option>
            ))}
          </select>
          <p className="muted text-sm">The check covers what this person already has out.</p>
        </section>
      ) : null}

      <OwnSupply
        value={ownSupply}
        onChange={(v) => {
          setOwnSupply(v);
          reset();
        }}
      />
      <OwnDriver
        value={ownDriver}
        onChange={(v) => {
          setOwnDriver(v);
          reset();
        }}
      />
      <OwnLeds
        value={ownLeds}
        onChange={(v) => {
          setOwnLeds(v);
          reset();
        }}
      />

      <button
        type="button"
        className="btn-primary w-full"
        disabled={!unitIds.length && !counted.length}
        onClick={() => preview.mutate()}
      >
        {preview.isPending ? 'Checking…' : 'Check these parts'}
      </button>
      <ErrorNote error={preview.error} />

      {p ? (
        <>
          <CheckReport
            result={p.outcome}
            verdict={p.outcome.verdict}
            borrowerName={borrowerId !== userId ? members.find((m) => m.id === borrowerId)?.name : undefined}
          />
          {p.outcome.kind === 'incomplete' && p.outcome.missing.includes('LEDs for the string') && !ownLeds ? (
            <p className="card text-sm">
              Bringing your own LEDs? Describe them under “My own LEDs” and check again: they are checked with
              the rest of the build.
            </p>
          ) : null}
          <Cautions cautions={p.outcome.cautions} />
          {p.gate === 'blocked' && p.outcome.kind === 'checked' ? (
            <Alternatives items={p.alternatives} />
          ) : null}
          <BorrowPanel
            selection={{ unitIds, counted, ...(ownParts ? { ownParts } : {}) }}
            gate={p.gate}
            available={p.available}
            unavailable={p.unavailable}
            dueText={new Intl.DateTimeFormat('en-GB', {
              dateStyle: 'medium',
              timeStyle: 'short',
              timeZone: p.timeZone,
            }).format(new Date(p.dueAt))}
            staff={staff}
            members={members}
            userId={userId}
            lendTo={borrowerId}
            inductions={p.inductions}
            deposit={p.deposit ? formatMoney(p.deposit.amountMinor, p.deposit.currency) : null}
          />
        </>
      ) : null}
    </div>
  );
}

function Picked({ label, detail, onRemove }: { label: string; detail: string; onRemove: () => void }) {
  return (
    <li className="flex items-center justify-between gap-2">
      <span>
        {label} <span className="muted text-sm">· {detail}</span>
      </span>
      <button type="button" className="btn-quiet" onClick={onRemove}>
        Remove
      </button>
    </li>
  );
}
