import { requirePageUser } from '@/lib/auth/guard';
import { SignedInFrame } from '@/components/shell/signed-in-frame';

// A label's page has the signed-in frame of app/(app) but lives outside that group on purpose: the group's
// loading.tsx would stream a "Loading…" shell first, and a redirect (unit, bin, a code that does not add up)
// or a not-found after that shell could no longer be an HTTP 307 or 404. Here the whole page, verdict
// included, is in the first answer.
export default async function LabelLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return <SignedInFrame ctx={ctx}>{children}</SignedInFrame>;
}
