'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { shortName } from '@/lib/short-name';
import { callApi, type ApiError } from './api';
import { ErrorNote } from './error-note';

type Selection =
  | { kitBoxId: string }
  | {
      unitIds: string[];
      counted: { partId: string; locationId: string; qty: number }[];
      /** Parts the borrower brings, described with the check's own fields. */
      ownParts?: Record<string, unknown>;
    };

// The borrow confirmation, built for a phone: the due date, the acknowledgement when the check gave
// cautions, a steward's written override when it failed, and one big button. The server checks it all
// again; this only collects what it needs.
export function BorrowPanel({
  selection,
  gate,
  available,
  unavailable,
  dueText,
  staff,
  members = [],
  userId,
  lendTo,
  inductions = null,
  deposit = null,
}: {
  selection: Selection;
  gate: 'ok' | 'acknowledge' | 'blocked';
  available: boolean;
  unavailable: string[];
  dueText: string;
  staff: boolean;
  members?: { id: string; name: string }[];
  userId: string;
  /** The borrower chosen before the check (loose parts: the check covers their build); no choice here then. */
  lendTo?: string;
  /** What the induction gate would say for this borrower (preview), or null. */
  inductions?: { missing: string[]; message: string } | null;
  /** The kit's deposit, formatted, when it asks for one: paid by card before it is lent. */
  deposit?: string | null;
}) {
  const router = useRouter();
  const ids = useId();
  const [ack, setAck] = useState(false);
  const [reason, setReason] = useState('');
  const [inductionReason, setInductionReason] = useState('');
  // Set when the server's answer names a missing sign-off (the preview was for someone else, say).
  const [serverNamedGap, setServerNamedGap] = useState(false);
  // A steward sees the induction override when the preview or the server's last answer names a gap.
  const inductionGap = staff && (inductions !== null || serverNamedGap);
  function overridesToSend(): { override?: unknown } {
    const list = [
      ...(gate === 'blocked' && staff ? [{ gate: 'check', reason }] : []),
      ...(inductionGap && inductionReason.trim() ? [{ gate: 'inductions', reason: inductionReason }] : []),
    ];
    return list.length === 0 ? {} : { override: list.length === 1 ? list[0] : list };
  }
  const [chosen, setBorrowerId] = useState(userId);
  const borrowerId = lendTo ?? chosen;
  const m = useMutation({
    mutationFn: () =>
      callApi<{ loan: { id: string; deposit: { url: string } | null } }>('/api/loans', 'POST', {
        ...selection,
        ...(gate === 'acknowledge' ? { acknowledgeCaution: ack } : {}),
        ...overridesToSend(),
        ...(borrowerId !== userId ? { borrowerId } : {}),
      }),
    // A kit that asks for a deposit: on to the processor's pay page; it comes back to the loan.
    onSuccess: ({ loan }) => (loan.deposit ? window.location.assign(loan.deposit.url) : router.push(`/loans/${loan.id}`)),
    onError: (e) => {
      if ((e as ApiError).fields?.inductions) setServerNamedGap(true);
    },
  });
  const fields = (m.error as ApiError | null)?.fields ?? {};

  if (!available)
    return (
      <div className="card" role="status">
        <p className="font-semibold">Not available to borrow right now</p>
        <ul className="mt-1 ml-5 list-disc">
          {unavailable.map((u) => (
            <li key={u}>{u}</li>
          ))}
        </ul>
      </div>
    );
  if (inductions && !staff)
    return (
      <div className="card" role="status">
        <p className="font-semibold">A sign-off is needed first</p>
        <p className="mt-1">{inductions.message}</p>
      </div>
    );
  if (gate === 'blocked' && !staff)
    return (
      <div className="card" role="status">
        <p className="font-semibold">This cannot be borrowed as it is.</p>
        <p className="mt-1">
          The check failed on these exact parts{'kitBoxId' in selection ? '' : ', checked together with the rest of your build'}. See what would work instead, or ask a steward at the bench.
        </p>
      </div>
    );

  // The button names whom it lends to once a steward has chosen someone else.
  const lendee = borrowerId !== userId ? shortName(members.find((p) => p.id === borrowerId)?.name ?? '') : null;
  const ready =
    (gate !== 'acknowledge' || ack) &&
    (gate !== 'blocked' || reason.trim().length > 0) &&
    (!inductionGap || inductionReason.trim().length > 0);
  return (
    <form
      className="card space-y-4"
      aria-label="Borrow"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate();
      }}
    >
      <p>
        Due back <strong>{dueText}</strong>.
      </p>
      {staff && members.length && lendTo === undefined ? (
        <div>
          <label className="label" htmlFor={`${ids}-who`}>
            Lend to
          </label>
          <select
            id={`${ids}-who`}
            className="field"
            value={borrowerId}
            onChange={(e) => setBorrowerId(e.target.value)}
          >
            {members.map((p) => (
              <option key={p.id} value={p.id}>
                {p.id === userId ? `${p.name} (me)` : p.name}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      {gate === 'acknowledge' ? (
        <label className="flex items-start gap-3 text-base">
          <input
            type="checkbox"
            className="mt-1 size-6 shrink-0"
            checked={ack}
            onChange={(e) => setAck(e.target.checked)}
          />
          <span>I have read the cautions and the reasons above, and will follow them.</span>
        </label>
      ) : null}
      {gate === 'blocked' ? (
        <div>
          <label className="label" htmlFor={`${ids}-reason`}>
            Why lend it although the check failed? (recorded with your name)
          </label>
          <textarea
            id={`${ids}-reason`}
            className="field"
            rows={3}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
          />
          {fields['override.reason'] ? (
            <p className="text-sm text-red-800 dark:text-red-300">{fields['override.reason'].join(' ')}</p>
          ) : null}
        </div>
      ) : null}
      {inductionGap ? (
        <div>
          {inductions ? <p className="mb-2">{inductions.message}</p> : null}
          <label className="label" htmlFor={`${ids}-ind-reason`}>
            Why lend it without the sign-off? (recorded with your name)
          </label>
          <textarea
            id={`${ids}-ind-reason`}
            className="field"
            rows={3}
            value={inductionReason}
            onChange={(e) => setInductionReason(e.target.value)}
          />
        </div>
      ) : null}
      {deposit ? (
        <p className="text-sm" data-testid="deposit-note">
          {'kitBoxId' in selection ? 'This kit takes' : 'These parts take'} a deposit of <strong>{deposit}</strong>, paid
          by card before it is lent. It comes back to the
          card when a steward has checked the return; a charge for anything missing or damaged is kept from it.
        </p>
      ) : null}
      <button
        type="submit"
        className={gate === 'blocked' || inductionGap ? 'btn-danger w-full text-lg' : 'btn-primary w-full text-lg'}
        disabled={!ready || m.isPending}
      >
        {m.isPending
          ? lendee
            ? `Lending to ${lendee}…`
            : 'Borrowing…'
          : gate === 'blocked' || inductionGap
            ? lendee
              ? `Override and lend to ${lendee}`
              : 'Override and lend'
            : lendee
              ? `Lend to ${lendee}`
              : deposit
                ? `Borrow it and pay ${deposit}`
                : 'Borrow it'}
      </button>
      <ErrorNote error={m.error} />
    </form>
  );
}
