import type { Ctx } from '@/lib/auth/roles';
import { AppHeader } from './app-header';

/** The header, the role navigation and the page's main column of every signed-in page. */
export function SignedInFrame({ ctx, children }: { ctx: Ctx; children: React.ReactNode }) {
  return (
    <>
      <AppHeader ctx={ctx} />
      {/* Room at the bottom for the phone's section bar. */}
      <main className="mx-auto max-w-6xl px-4 pt-5 pb-24 sm:pb-5">{children}</main>
    </>
  );
}
