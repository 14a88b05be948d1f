'use client';
import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { safeNextPath } from '@/lib/auth/safe-next';

const MESSAGES: Record<string, string> = {
  CredentialsSignin: 'That e-mail and password do not match an active account.',
  TooManyAttempts: 'Too many failed attempts for this e-mail from here. Wait a minute and try again, or ask for a sign-in link.',
};

export function SignInForm({ next, initialError }: { next: string; initialError?: string }) {
  const router = useRouter();
  const [error, setError] = useState(initialError ? (MESSAGES[initialError] ?? 'Sign-in failed.') : '');
  const [linkNote, setLinkNote] = useState('');
  const [busy, setBusy] = useState(false);

  async function onPassword(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    setBusy(true);
    setError('');
    const res = await signIn('password', {
      email: String(data.get('email')),
      password: String(data.get('password')),
      redirect: false,
    });
    setBusy(false);
    if (res?.ok && !res.error) {
      router.push(safeNextPath(next)); // checked again here: the prop is the only way in
      router.refresh();
    } else setError(MESSAGES[res?.error ?? ''] ?? 'Sign-in failed.');
  }

  async function onLink(e: React.MouseEvent) {
    e.preventDefault();
    const form = (e.currentTarget as HTMLButtonElement).form!;
    const email = String(new FormData(form).get('email') ?? '');
    setLinkNote('');
    setError('');
    const res = await fetch('/api/sign-in-link', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email }),
    });
    if (res.ok) setLinkNote(`If ${email} has an account here, a sign-in link is on its way. It works once, for 15 minutes.`);
    else {
      const body = await res.json().catch(() => null);
      setError(body?.error?.message ?? 'Could not send a link.');
    }
  }

  return (
    <form onSubmit={onPassword} className="card mt-6 space-y-4" noValidate>
      <div>
        <label className="label" htmlFor="email">
          E-mail
        </label>
        <input id="email" name="email" type="email" autoComplete="username" required className="field" />
      </div>
      <div>
        <label className="label" htmlFor="password">
          Password
        </label>
        <input id="password" name="password" type="password" autoComplete="current-password" className="field" />
      </div>
      {error ? (
        <p role="alert" className="rounded-md border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-100">
          {error}
        </p>
      ) : null}
      {linkNote ? (
        <p role="status" className="rounded-md border border-accent bg-accent-soft p-2 text-sm text-stone-900">
          {linkNote}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? 'Signing in…' : 'Sign in'}
        </button>
        <button type="button" className="btn-quiet" onClick={onLink}>
          E-mail me a sign-in link
        </button>
      </div>
    </form>
  );
}
