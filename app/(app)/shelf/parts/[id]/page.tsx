import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { partPage } from '@/lib/inventory/part-page';
import { notFoundUnlessFound } from '@/components/shelf/not-found';
import { PartView } from '@/components/shelf/part-view';

export const metadata = { title: 'Part' };

// The part's page; its label's /s/<code> renders the same view in place (app/s/[code]).
export default async function PartPageRoute({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ unit?: string }>;
}) {
  const ctx = await requirePageUser();
  const { id } = await params;
  const { unit: highlight } = await searchParams;
  const data = await notFoundUnlessFound(partPage(db, ctx, id));
  return <PartView data={data} highlight={highlight} />;
}
