import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { buyersOf, sellableCatalog } from '@/lib/sales/catalog';
import { spaceClock } from '@/lib/sales/periods';
import { Counter } from '@/components/counter/counter';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Counter' };

export default async function CounterPage() {
  const ctx = await requirePageRole('member', 'steward');
  const { currency } = await spaceClock(db, ctx.spaceId);
  const items = await sellableCatalog(db, ctx.spaceId);
  const buyers = isStaff(ctx) ? await buyersOf(db, ctx.spaceId) : null;
  return (
    <>
      <PageTitle
        title="Counter"
        lead={`Consumables to keep, priced in ${currency}. Pay by card${buyers ? ', or record cash into the honour box' : ''}.`}
      />
      <Counter currency={currency} items={items} me={ctx.userId} buyers={buyers} />
    </>
  );
}
