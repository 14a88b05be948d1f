import { redirect } from 'next/navigation';
import { currentCtx } from '@/lib/auth/guard';
import { SignInForm } from '@/components/auth/sign-in-form';
import { AppHeader } from '@/components/shell/app-header';
import { safeNextPath } from '@/lib/auth/safe-next';

export const metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const { next: rawNext, error } = await searchParams;
  // Only a path of this site: never bounce a visitor to another host after sign-in.
  const next = safeNextPath(rawNext);
  if (await currentCtx()) redirect(next);
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-md px-4 py-10">
        <h1 className="text-2xl font-bold">Sign in to the bench</h1>
        <p className="muted mt-1">With your password, or ask for a one-time link by e-mail.</p>
        <SignInForm next={next} initialError={error} />
      </main>
    </>
  );
}
