import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { boxPage } from '@/lib/kits/box-page';
import { BoxView } from '@/components/kits/box-view';
import { orNotFound, pageId } from '../../../loans/or-not-found';

export const metadata = { title: 'Kit box' };

// The kit box's page; its label's /s/<code> renders the same view in place (app/s/[code]).
export default async function KitBoxPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageUser();
  const id = pageId((await params).id);
  const data = await orNotFound(() => boxPage(db, ctx, id));
  return <BoxView data={data} userId={ctx.userId} />;
}
