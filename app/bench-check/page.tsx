import type { Metadata } from 'next';
import { unstable_rethrow } from 'next/navigation';
import { BenchCheck } from '@/components/bench-check/bench-check';
import { AppHeader } from '@/components/shell/app-header';
import { PageTitle } from '@/components/ui/page-title';
import { currentCtx } from '@/lib/auth/guard';
import type { Ctx } from '@/lib/auth/roles';

export const metadata: Metadata = {
  title: 'Bench check',
  description: 'Check a supply, an LED driver and an LED string against each other before you power them.',
};

// Public: anyone can check a build, signed in or not. The check itself runs in the browser.
export default async function BenchCheckPage() {
  let ctx: Ctx | null = null;
  try {
    ctx = await currentCtx();
  } catch (err) {
    unstable_rethrow(err); // Next's own signals (dynamic rendering) must pass through
    ctx = null; // the page works without the database; only the header loses the person's name
  }
  return (
    <>
      <AppHeader ctx={ctx} />
      <main className="mx-auto max-w-6xl px-4 py-5">
        <PageTitle
          title="Bench check"
          lead="Will this supply, driver and LED string work together? Enter the parts; the check uses the worst case of the supply's tolerance and the LEDs' forward-voltage spread."
        />
        <BenchCheck />
      </main>
    </>
  );
}
