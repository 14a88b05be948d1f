import { redirect } from 'next/navigation';
import { currentCtx } from '@/lib/auth/guard';
import { SignInForm } from '@/components/auth/sign-in-form';
import { AppHeader } from '@/components/shell/app-header';

export const metadata = { title: 'Sign in' };

function safeNext(next: string | undefined): string {
  // Only same-site paths: never bounce a visitor to another host after sign-in.
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/today';
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const { next, error } = await searchParams;
  if (await currentCtx()) redirect(safeNext(next));
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-md px-4 py-10">
        <h1 className="text-2xl font-bold">Sign in to the bench</h1>
        <p className="muted mt-1">With your password, or ask for a one-time link by e-mail.</p>
        <SignInForm next={safeNext(next)} initialError={error} />
      </main>
    </>
  );
}
