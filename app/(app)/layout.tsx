import { requirePageUser } from '@/lib/auth/guard';
import { AppHeader } from '@/components/shell/app-header';

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return (
    <>
      <AppHeader ctx={ctx} />
      <main className="mx-auto max-w-6xl px-4 py-5">{children}</main>
    </>
  );
}
