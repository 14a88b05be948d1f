import { requirePageUser } from '@/lib/auth/guard';
import { AppHeader } from '@/components/shell/app-header';

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return (
    <>
      <AppHeader ctx={ctx} />
      {/* Room at the bottom for the phone's section bar. */}
      <main className="mx-auto max-w-6xl px-4 pt-5 pb-24 sm:pb-5">{children}</main>
    </>
  );
}
