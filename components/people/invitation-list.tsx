'use client';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import type { Invitation } from '@/lib/people/invitations';
import { formatDate } from '@/lib/format';
import { ROLE_WORDS } from '@/lib/people/schema';
import { InlineError } from './form-field';
import { errorText, sendJson } from './send-json';

function WithdrawButton({ invitation }: { invitation: Invitation }) {
  const router = useRouter();
  const withdraw = useMutation({
    mutationFn: () => sendJson(`/api/invitations/${invitation.id}`, 'DELETE'),
    onSuccess: () => router.refresh(),
  });
  return (
    <div className="flex flex-col items-end gap-1">
      <button
        type="button"
        className="btn-quiet min-h-9 px-3 py-1 text-sm"
        disabled={withdraw.isPending}
        onClick={() => withdraw.mutate()}
      >
        Withdraw<span className="sr-only"> the invitation to {invitation.email}</span>
      </button>
      {withdraw.isError ? <InlineError alert>{errorText(withdraw.error)}</InlineError> : null}
    </div>
  );
}

/** Invitations not yet accepted, with the date each link stops working. */
export function InvitationList({ invitations, timeZone }: { invitations: Invitation[]; timeZone: string }) {
  if (!invitations.length) return <p className="muted">No invitations waiting.</p>;
  return (
    <ul className="divide-y divide-stone-200 dark:divide-stone-800">
      {invitations.map((i) => (
        <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
          <span className="min-w-0">
            <strong>{i.name}</strong> <span className="break-all">{i.email}</span>
            <span className="muted block text-sm">
              {i.roles.map((r) => ROLE_WORDS[r]).join(', ')} · link works until{' '}
              {formatDate(i.expiresAt, timeZone)}
            </span>
          </span>
          <WithdrawButton invitation={i} />
        </li>
      ))}
    </ul>
  );
}
