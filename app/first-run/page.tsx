import { notFound } from 'next/navigation';
import { db } from '@/db';
import { AppHeader } from '@/components/shell/app-header';
import { FirstRunForm } from '@/components/setup/first-run-form';
import { firstRunOpen } from '@/lib/setup/first-run';
import { CURRENCIES, TIME_ZONES } from '@/lib/settings/schema';

export const metadata = { title: 'Set up your space' };

// Public while no space exists (a fresh `npm run serve`); from the first space on, a 404 for good.
export default async function FirstRunPage() {
  if (!(await firstRunOpen(db))) notFound();
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-md px-4 py-10">
        <h1 className="text-2xl font-bold">Set up your space</h1>
        <p className="muted mt-1">
          Name the space, choose its money and clock, and make the first admin account. This page closes as soon as
          the space exists.
        </p>
        <FirstRunForm currencies={[...CURRENCIES]} timeZones={[...TIME_ZONES]} />
      </main>
    </>
  );
}
