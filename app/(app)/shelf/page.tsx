import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { listParts } from '@/lib/inventory/parts-list';
import { partListQuerySchema } from '@/lib/inventory/schemas';
import { PageTitle } from '@/components/ui/page-title';
import { PartsTable } from '@/components/shelf/parts-table';

export const metadata = { title: 'Shelf' };

export default async function ShelfPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const ctx = await requirePageUser();
  const raw = Object.fromEntries(
    Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]),
  );
  const parsed = partListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : partListQuerySchema.parse({});
  const page = await listParts(db, ctx, query);
  return (
    <div>
      <PageTitle
        title={query.below ? 'Below reorder point' : 'Shelf'}
        lead={`Parts and stock at ${ctx.spaceName}.`}
      >
        {isStaff(ctx) ? (
          <>
            <Link href="/shelf/parts/new" className="btn-primary">
              Add a part
            </Link>
            <Link href="/shelf/receive" className="btn-quiet">
              Receive stock
            </Link>
          </>
        ) : null}
      </PageTitle>
      <PartsTable initial={page} initialQuery={query} />
    </div>
  );
}
