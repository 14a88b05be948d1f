import { requirePageUser } from '@/lib/auth/guard';
import { ScanBox } from '@/components/scan/scan-box';

export const metadata = { title: 'Scan' };

export default async function ScanPage({ searchParams }: { searchParams: Promise<{ code?: string }> }) {
  const ctx = await requirePageUser();
  const { code } = await searchParams;
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-2xl font-bold tracking-tight">Scan a label</h1>
      <p className="muted mb-4">Any label at {ctx.spaceName}: a unit, a part, a bin or a kit box.</p>
      <ScanBox initial={typeof code === 'string' ? code.slice(0, 200) : ''} />
    </div>
  );
}
