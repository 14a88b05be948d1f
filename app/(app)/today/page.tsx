import Link from 'next/link';
import { formatQty } from '@/lib/inventory/measure';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { todaySummary } from '@/lib/today/summary';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';
import { OutOfServiceList } from '@/components/kits/out-of-service-list';
import { countOf, formatDate, formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';

export const metadata = { title: 'Today' };

export default async function TodayPage() {
  const ctx = await requirePageUser();
  const s = await todaySummary(db, ctx);
  const space = await db.selectFrom('spaces').select('time_zone').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow();
  const tz = space.time_zone;
  return (
    <div className="space-y-5">
      <PageTitle title={`Today at ${ctx.spaceName}`} lead={`Signed in as ${ctx.name} · ${ctx.roles.join(', ')}`}>
        <Link href="/scan" className="btn-primary">
          Scan a label
        </Link>
      </PageTitle>

      <section aria-labelledby="my-loans" className="card">
        <h2 id="my-loans" className="text-lg font-bold">
          My loans
        </h2>
        {s.myLoans.length === 0 ? (
          <p className="muted mt-2">Nothing out in your name. Scan a kit box to borrow it.</p>
        ) : (
          <ul className="mt-2 divide-y divide-stone-200 dark:divide-stone-800">
            {s.myLoans.map((l) => (
              <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <Link href={`/loans/${l.id}`}>{l.name}</Link>
                <span className="flex items-center gap-2 text-sm">
                  due {formatDateTime(l.dueAt, tz)} <StatePill state={l.overdue ? 'overdue' : 'out'} />
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>

      {s.steward ? (
        <section aria-labelledby="bench" className="card">
          <h2 id="bench" className="text-lg font-bold">
            The bench
          </h2>
          <ul className="mt-2 grid gap-3 sm:grid-cols-3">
            <li>
              <Link href="/loans/round" className="block rounded-lg border border-stone-200 p-3 no-underline dark:border-stone-700">
                <span className="block text-3xl font-bold">{s.steward.overdue}</span>{' '}
                {s.steward.overdue === 1 ? 'overdue loan' : 'overdue loans'}
              </Link>
            </li>
            <li>
              <Link href="/shelf?below=1" className="block rounded-lg border border-stone-200 p-3 no-underline dark:border-stone-700">
                <span className="block text-3xl font-bold">{s.steward.belowReorder.length}</span>{' '}
                {s.steward.belowReorder.length === 1 ? 'part below its reorder point' : 'parts below their reorder point'}
              </Link>
            </li>
            <li>
              <Link href="/shelf/repairs" className="block rounded-lg border border-stone-200 p-3 no-underline dark:border-stone-700">
                <span className="block text-3xl font-bold">{s.steward.boxesOut.length + s.steward.inRepair}</span>{' '}
                out of service
                <span className="muted block text-sm">
                  {countOf(s.steward.boxesOut.length, 'kit box', 'kit boxes')}, {countOf(s.steward.inRepair, 'unit')} in repair
                </span>
              </Link>
            </li>
          </ul>
          <p className="mt-3">
            <Link href="/orders">
              <strong>{s.steward.toOrder}</strong> {s.steward.toOrder === 1 ? 'part' : 'parts'} to order
            </Link>
            {s.steward.overdueOrders.length ? `, ${countOf(s.steward.overdueOrders.length, 'delivery', 'deliveries')} overdue` : ''}
          </p>
          {s.steward.overdueOrders.length ? (
            <ul className="mt-1 text-sm" aria-label="Overdue deliveries">
              {s.steward.overdueOrders.slice(0, 6).map((o) => (
                <li key={o.id}>
                  <Link href={`/orders/${o.id}`}>{o.supplierName}</Link>: sent {formatDate(o.sentAt, tz)}, expected by {formatDate(o.expectedAt, tz)}
                </li>
              ))}
            </ul>
          ) : null}
          {s.steward.releasePending.length ? (
            <ul className="mt-3 text-sm" aria-label="Deposits waiting to go back">
              {s.steward.releasePending.map((d) => (
                <li key={d.loanId}>
                  <Link href={`/loans/${d.loanId}`}>Deposit for {d.item}</Link>
                  {d.borrower ? ` (${d.borrower})` : ''}: release pending, the card processor has not taken the refund yet;
                  it is tried again every few minutes.
                </li>
              ))}
            </ul>
          ) : null}
          {s.steward.boxesOut.length ? (
            <div className="mt-3">
              <OutOfServiceList boxes={s.steward.boxesOut.slice(0, 6)} timeZone={tz} />
              {s.steward.boxesOut.length > 6 ? (
                <Link href="/shelf/repairs" className="mt-2 inline-block">
                  All {s.steward.boxesOut.length} boxes out of service
                </Link>
              ) : null}
            </div>
          ) : null}
          {s.steward.belowReorder.length ? (
            <ul className="mt-3 text-sm">
              {s.steward.belowReorder.slice(0, 6).map((p) => (
                <li key={p.id}>
                  <Link href={`/shelf/parts/${p.id}`}>{p.name}</Link>: {formatQty(p.qty, p.saleUnit)} left (reorder at{' '}
                  {formatQty(p.reorderPoint, p.saleUnit)})
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}

      {s.treasurer ? (
        <section aria-labelledby="money" className="card">
          <h2 id="money" className="text-lg font-bold">
            Money
          </h2>
          <p className="mt-2">
            Paid this month: <strong>{formatMoney(s.treasurer.paidThisMonthMinor, s.treasurer.currency)}</strong>
          </p>
          <p className="mt-1">
            {countOf(s.treasurer.pendingSales, 'card sale')} waiting for the processor
            {s.treasurer.oldPending ? `, ${s.treasurer.oldPending} of them for over an hour` : ''}.{' '}
            <Link href="/books">Open the books</Link>
          </p>
          <p className="mt-1">
            Restocking received this month: <strong>{formatMoney(s.treasurer.restock.receivedMinor, s.treasurer.currency)}</strong>
            {s.treasurer.restock.budgetMinor !== null
              ? ` of a ${formatMoney(s.treasurer.restock.budgetMinor, s.treasurer.currency)} budget (${formatMoney(s.treasurer.restock.committedMinor, s.treasurer.currency)} committed)`
              : ' (no monthly budget set)'}
            .
          </p>
        </section>
      ) : null}

      {s.admin ? (
        <section aria-labelledby="people" className="card">
          <h2 id="people" className="text-lg font-bold">
            People
          </h2>
          <p className="mt-2">
            {countOf(s.admin.people, 'person', 'people')} in this space,{' '}
            {countOf(s.admin.openInvitations, 'invitation')} not yet accepted.{' '}
            <Link href="/people">Manage people</Link>
          </p>
        </section>
      ) : null}
    </div>
  );
}
