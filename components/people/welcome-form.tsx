'use client';
import { zodResolver } from '@hookform/resolvers/zod';
import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { MIN_PASSWORD, welcomeFormSchema, type WelcomeFormInput } from '@/lib/people/schema';
import { describedBy, FormField, FormNote } from './form-field';
import { applyFieldErrors, errorText, sendJson } from './send-json';

const FIELDS = ['name', 'password'] as const;

async function accept(body: { token: string; name?: string; password?: string }) {
  return sendJson<{ email: string; newAccount: boolean }>('/api/invitations/accept', 'POST', body);
}

/** A new person picks their name and password; then they are signed in straight away. */
export function WelcomeForm({ token, email, name }: { token: string; email: string; name: string }) {
  const router = useRouter();
  const [error, setErrorText] = useState('');
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<WelcomeFormInput>({
    resolver: zodResolver(welcomeFormSchema),
    defaultValues: { name, password: '', confirm: '' },
  });

  const onSubmit = handleSubmit(async ({ name: chosenName, password }) => {
    setErrorText('');
    try {
      await accept({ token, name: chosenName, password });
    } catch (err) {
      const unplaced = applyFieldErrors(err, setError, FIELDS);
      setErrorText([errorText(err), ...unplaced].join(' '));
      return;
    }
    const res = await signIn('password', { email, password, redirect: false });
    router.push(res?.ok && !res.error ? '/today' : '/signin?next=%2Ftoday');
    router.refresh();
  });

  const hint = `At least ${MIN_PASSWORD} characters. A short sentence is easy to remember.`;
  return (
    <form onSubmit={onSubmit} noValidate className="card mt-6 space-y-4">
      <FormField id="welcome-email" label="E-mail">
        <input
          id="welcome-email"
          value={email}
          readOnly
          className="field bg-stone-100 dark:bg-stone-800"
          autoComplete="username"
        />
      </FormField>
      <FormField id="welcome-name" label="Your name" error={errors.name?.message}>
        <input
          {...register('name')}
          defaultValue={name}
          {...describedBy('welcome-name', errors.name?.message)}
          className="field"
          autoComplete="name"
        />
      </FormField>
      <FormField id="welcome-password" label="Password" error={errors.password?.message} hint={hint}>
        <input
          {...register('password')}
          {...describedBy('welcome-password', errors.password?.message, true)}
          type="password"
          className="field"
          autoComplete="new-password"
        />
      </FormField>
      <FormField id="welcome-confirm" label="Password again" error={errors.confirm?.message}>
        <input
          {...register('confirm')}
          {...describedBy('welcome-confirm', errors.confirm?.message)}
          type="password"
          className="field"
          autoComplete="new-password"
        />
      </FormField>
      {error ? <FormNote kind="error">{error}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={isSubmitting}>
        {isSubmitting ? 'Setting up…' : 'Join and sign in'}
      </button>
    </form>
  );
}

/** Someone who already has an account only confirms; their password stays as it is. */
export function AcceptForExisting({ token, spaceName }: { token: string; spaceName: string }) {
  const router = useRouter();
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  async function go() {
    setBusy(true);
    setError('');
    try {
      await accept({ token });
      router.push('/signin?next=%2Ftoday');
    } catch (err) {
      setError(errorText(err));
      setBusy(false);
    }
  }
  return (
    <div className="card mt-6 space-y-3">
      <button type="button" className="btn-primary" onClick={go} disabled={busy}>
        Add {spaceName} to my account
      </button>
      {error ? <FormNote kind="error">{error}</FormNote> : null}
    </div>
  );
}
