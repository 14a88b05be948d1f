import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { listOpenCounts } from '@/lib/inventory/counts';
import { listLocations } from '@/lib/inventory/locations';
import { PageTitle } from '@/components/ui/page-title';
import { CountMode } from '@/components/shelf/count-mode';

export const metadata = { title: 'Stock counts' };

export default async function CountsPage({ searchParams }: { searchParams: Promise<{ count?: string }> }) {
  const ctx = await requirePageRole('steward', 'admin');
  const { count } = await searchParams;
  const [locations, open] = await Promise.all([listLocations(db, ctx), listOpenCounts(db, ctx)]);
  return (
    <div className="max-w-4xl">
      <PageTitle
        title="Count a bin"
        lead="Count what is physically there; posting makes the records match, with every difference kept in the history."
      />
      <CountMode
        locations={locations.map((l) => ({ id: l.id, name: l.name, code: l.code }))}
        openCounts={open.map((c) => ({ id: c.id, locationName: c.locationName }))}
        resumeId={open.some((c) => c.id === count) ? count : null}
      />
    </div>
  );
}
