import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { buyersOf, sellableCatalog } from '@/lib/sales/catalog';
import { spaceClock } from '@/lib/sales/periods';
import { Counter } from '@/components/counter/counter';
import { moneyRules, taxRuleOf } from '@/lib/money-rules/settings';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Counter' };

export default async function CounterPage() {
  const ctx = await requirePageRole('member', 'steward');
  const { currency } = await spaceClock(db, ctx.spaceId);
  const items = await sellableCatalog(db, ctx.spaceId);
  const buyers = isStaff(ctx) ? await buyersOf(db, ctx.spaceId) : null;
  const rules = await moneyRules(db, ctx.spaceId);
  return (
    <>
      <PageTitle
        title="Counter"
        lead={`Consumables to keep, priced in ${currency}${rules.taxMode === 'exempt' ? '' : rules.taxMode === 'inclusive' ? `, ${rules.taxName} included` : `, plus ${rules.taxName}`}. Pay by card, or ${buyers ? 'record cash into the honour box' : 'put cash in the honour box and record it here'}.`}
      >
        {buyers ? (
          <Link href="/counter/honour-box" className="btn-quiet">
            Honour box
          </Link>
        ) : null}
      </PageTitle>
      <Counter
        currency={currency}
        items={items}
        me={ctx.userId}
        buyers={buyers}
        tax={{ name: rules.taxName, ...taxRuleOf(rules) }}
        minCardMinor={rules.minCardMinor}
      />
    </>
  );
}
