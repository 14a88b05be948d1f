import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { getPartDetail } from '@/lib/inventory/part-detail';
import { PageTitle } from '@/components/ui/page-title';
import { PartForm } from '@/components/shelf/part-form';
import { notFoundUnlessFound } from '@/components/shelf/not-found';

export const metadata = { title: 'Edit part' };

export default async function EditPartPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageRole('steward', 'admin');
  const { id } = await params;
  const { part, currency } = await notFoundUnlessFound(getPartDetail(db, ctx, id, 0));
  return (
    <div className="max-w-4xl">
      <PageTitle title={`Edit ${part.name}`} />
      <PartForm partId={part.id} initial={part} locations={[]} currency={currency} />
    </div>
  );
}
