import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { db } from '@/db';
import { codeFromScan } from '@/labels/url';
import { requirePageUser } from '@/lib/auth/guard';
import { NotFoundError } from '@/lib/errors';
import { boxPage } from '@/lib/kits/box-page';
import { partPage } from '@/lib/inventory/part-page';
import { resolveCode, type Resolved } from '@/lib/inventory/resolve';
import { BoxView } from '@/components/kits/box-view';
import { PartView } from '@/components/shelf/part-view';
import { QueryProvider } from '@/components/shell/query-provider';

// A label's QR holds <base>/s/<code>: a phone's own camera lands here. A kit box or a part is shown right
// here, rendered on the server (no redirect: on a phone's slow network one round trip less before the
// verdict is on screen); a unit or a bin is sent to its page. A code that does not add up goes to the scan
// page, which offers "did you mean"; a code of another space (or none) is the not-found page.

function decoded(raw: string): string {
  try {
    return decodeURIComponent(raw);
  } catch {
    return raw;
  }
}

/** The label in the caller's space, once per request (the title and the page share it). */
const labelled = cache(async (spaceId: string, code: string): Promise<Resolved> => {
  try {
    return await resolveCode(db, { spaceId }, code);
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
});

export async function generateMetadata({ params }: { params: Promise<{ code: string }> }): Promise<Metadata> {
  const ctx = await requirePageUser();
  const code = decoded((await params).code);
  if (!codeFromScan(code).ok) return { title: 'Label' };
  const found = await labelled(ctx.spaceId, code);
  return { title: found.kind === 'kit_box' ? 'Kit box' : found.kind === 'part' ? 'Part' : 'Label' };
}

export default async function LabelPage({ params }: { params: Promise<{ code: string }> }) {
  const ctx = await requirePageUser();
  const code = decoded((await params).code);
  if (!codeFromScan(code).ok) redirect(`/scan?code=${encodeURIComponent(code.slice(0, 40))}`);
  const found = await labelled(ctx.spaceId, code);
  if (found.kind === 'kit_box') {
    const data = await boxPage(db, ctx, found.targetId).catch((err: unknown) => {
      if (err instanceof NotFoundError) notFound();
      throw err;
    });
    // The box's borrow, hold and upkeep buttons send through TanStack Query; a part's page needs no client.
    return (
      <QueryProvider>
        <BoxView data={data} userId={ctx.userId} />
      </QueryProvider>
    );
  }
  if (found.kind === 'part') {
    const data = await partPage(db, ctx, found.targetId).catch((err: unknown) => {
      if (err instanceof NotFoundError) notFound();
      throw err;
    });
    return <PartView data={data} />;
  }
  redirect(found.href);
}
