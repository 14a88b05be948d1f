import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { loosePick, spaceMembers } from '@/lib/loans/queries';
import { LooseBorrow } from '@/components/loans/loose-borrow';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Borrow loose parts' };

export default async function LooseBorrowPage() {
  const ctx = await requirePageUser();
  const staff = isStaff(ctx);
  const [pick, members] = await Promise.all([
    loosePick(db, ctx),
    staff ? spaceMembers(db, ctx) : Promise.resolve([]),
  ]);
  return (
    <div className="mx-auto max-w-xl">
      <PageTitle
        title="Borrow loose parts"
        lead="A supply, a driver and some LEDs: add each, and the chain is checked on exactly those parts before they go out."
      />
      <LooseBorrow pick={pick} staff={staff} members={members} userId={ctx.userId} />
    </div>
  );
}
