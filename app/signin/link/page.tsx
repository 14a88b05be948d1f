import { AppHeader } from '@/components/shell/app-header';
import { LinkSignIn } from '@/components/auth/link-sign-in';
import { safeNextPath } from '@/lib/auth/safe-next';

export const metadata = { title: 'Sign-in link' };

// The link only signs in after a click, so mail scanners that fetch links do not use it up.
export default async function LinkPage({ searchParams }: { searchParams: Promise<{ token?: string; next?: string }> }) {
  const { token, next } = await searchParams;
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-md px-4 py-10">
        <h1 className="text-2xl font-bold">Your sign-in link</h1>
        {token ? <LinkSignIn token={token} next={safeNextPath(next)} /> : <p className="mt-3">This link is incomplete. Ask for a new one.</p>}
      </main>
    </>
  );
}
