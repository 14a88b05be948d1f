'use client';
import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { safeNextPath } from '@/lib/auth/safe-next';

export function LinkSignIn({ token, next }: { token: string; next: string }) {
  const router = useRouter();
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  async function go() {
    setBusy(true);
    const res = await signIn('email-link', { token, redirect: false });
    setBusy(false);
    if (res?.ok && !res.error) {
      router.push(safeNextPath(next));
      router.refresh();
    } else setError('This link has been used or has expired. Ask for a new one from the sign-in page.');
  }
  return (
    <div className="card mt-4 space-y-3">
      <p>Continue to sign in on this device. The link works once.</p>
      <button className="btn-primary" onClick={go} disabled={busy}>
        Continue signing in
      </button>
      {error ? (
        <p role="alert" className="text-sm text-red-800 dark:text-red-200">
          {error} <a href="/signin">Sign-in page</a>
        </p>
      ) : null}
    </div>
  );
}
