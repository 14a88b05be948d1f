'use client';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { FormNote } from '@/components/people/form-field';
import { ApiError, errorText, sendJson } from '@/components/people/send-json';

/** A steward signs a member off: which induction, who, an optional last day, a note. */
export function SignoffForm({
  inductions,
  members,
}: {
  inductions: { id: string; name: string }[];
  members: { id: string; name: string }[];
}) {
  const router = useRouter();
  const ids = useId();
  const [inductionId, setInductionId] = useState(inductions[0]?.id ?? '');
  const [userId, setUserId] = useState(members[0]?.id ?? '');
  const [expiresOn, setExpiresOn] = useState('');
  const [note, setNote] = useState('');
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  return (
    <form
      className="space-y-3"
      aria-label="Sign someone off"
      noValidate
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setMsg(null);
        setFields({});
        try {
          await sendJson(`/api/inductions/${inductionId}/signoffs`, 'POST', {
            userId,
            ...(expiresOn ? { expiresOn } : {}),
            note,
          });
          const who = members.find((m) => m.id === userId)?.name ?? 'They';
          const what = inductions.find((i) => i.id === inductionId)?.name ?? 'the induction';
          setMsg({ kind: 'ok', text: `${who} is signed off for “${what}”.` });
          setNote('');
          setExpiresOn('');
          router.refresh();
        } catch (err) {
          if (err instanceof ApiError) setFields(err.fields);
          setMsg({ kind: 'error', text: errorText(err) });
        } finally {
          setBusy(false);
        }
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label className="label" htmlFor={`${ids}-ind`}>
            Induction
          </label>
          <select id={`${ids}-ind`} className="field" value={inductionId} onChange={(e) => setInductionId(e.target.value)}>
            {inductions.map((i) => (
              <option key={i.id} value={i.id}>
                {i.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor={`${ids}-who`}>
            Member
          </label>
          <select id={`${ids}-who`} className="field" value={userId} onChange={(e) => setUserId(e.target.value)}>
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
          {fields.userId ? <p className="text-sm text-red-800 dark:text-red-300">{fields.userId.join('; ')}</p> : null}
        </div>
        <div>
          <label className="label" htmlFor={`${ids}-until`}>
            Holds until (optional)
          </label>
          <input id={`${ids}-until`} type="date" className="field" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
          {fields.expiresOn ? <p className="text-sm text-red-800 dark:text-red-300">{fields.expiresOn.join('; ')}</p> : null}
        </div>
        <div>
          <label className="label" htmlFor={`${ids}-note`}>
            Note (optional)
          </label>
          <input id={`${ids}-note`} className="field" value={note} maxLength={1000} onChange={(e) => setNote(e.target.value)} />
        </div>
      </div>
      {msg ? <FormNote kind={msg.kind}>{msg.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={busy || !inductionId || !userId}>
        {busy ? 'Signing off…' : 'Sign off'}
      </button>
    </form>
  );
}
