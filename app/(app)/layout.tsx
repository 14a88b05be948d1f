import { requirePageUser } from '@/lib/auth/guard';
import { SignedInFrame } from '@/components/shell/signed-in-frame';

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return <SignedInFrame ctx={ctx}>{children}</SignedInFrame>;
}
