import Link from 'next/link';
import { redirect } from 'next/navigation';
import { currentCtx } from '@/lib/auth/guard';
import { AppHeader } from '@/components/shell/app-header';

export default async function Home() {
  if (await currentCtx()) redirect('/today');
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-2xl px-4 py-12">
        <h1 className="text-3xl font-bold tracking-tight">The electronics bench, in one place</h1>
        <p className="muted mt-3 text-lg">
          Borrow LED and power kits, buy consumables, and check that a supply, a driver and a string of LEDs will work
          together before anything gets hot.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link href="/signin" className="btn-primary">
            Sign in
          </Link>
          <Link href="/bench-check" className="btn-quiet">
            Check a build — no account needed
          </Link>
        </div>
      </main>
    </>
  );
}
