import Link from 'next/link';
import { formatQty } from '@/lib/inventory/measure';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { hasRole } from '@/lib/auth/roles';
import { countOf, formatDate } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { ORDER_STATE_WORDS } from '@/lib/restock/order-words';
import { listOrders } from '@/lib/restock/orders';
import { REASON_WORDS } from '@/lib/restock/to-order';
import { whatToOrder } from '@/lib/restock/to-order-query';
import { monthLabel, spaceClock } from '@/lib/sales/periods';
import { PageTitle } from '@/components/ui/page-title';
import { BudgetForm } from '@/components/restock/budget-form';
import { StartOrder } from '@/components/restock/start-order';

export const metadata = { title: 'Restock' };

export default async function RestockPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [toOrder, { orders, budget }, { timeZone }] = await Promise.all([
    whatToOrder(db, ctx),
    listOrders(db, ctx),
    spaceClock(db, ctx.spaceId),
  ]);
  const money = (n: number) => formatMoney(n, toOrder.currency);
  const left = budget.budgetMinor === null ? null : budget.budgetMinor - budget.committedMinor;
  return (
    <div className="space-y-6">
      <PageTitle title="Restock" lead="What the shelf needs, in whole packs from each supplier, and the order lists on their way.">
        <Link href="/orders/suppliers" className="btn-quiet">
          Suppliers
        </Link>
      </PageTitle>

      <section aria-labelledby="budget" className="card">
        <h2 id="budget" className="text-lg font-bold">
          Budget for {monthLabel(budget.month)}
        </h2>
        <p className="mt-1">
          Committed <strong>{money(budget.committedMinor)}</strong> · received <strong>{money(budget.receivedMinor)}</strong>
          {budget.budgetMinor === null ? (
            <> · no monthly budget set</>
          ) : (
            <>
              {' '}
              of <strong>{money(budget.budgetMinor)}</strong>
              {left! < 0 ? <span className="font-semibold text-red-800 dark:text-red-300"> — {money(-left!)} over</span> : <> — {money(left!)} left</>}
            </>
          )}
        </p>
        <p className="muted mt-1 text-sm">
          Committed: order lists sent this month, not called off. Received: what arrived this month, at the price paid. Sending past the
          budget needs an admin’s approval with a note.
        </p>
        {hasRole(ctx, 'admin') ? <BudgetForm currency={budget.currency} budgetMinor={budget.budgetMinor} /> : null}
      </section>

      <section aria-labelledby="to-order" className="space-y-3">
        <h2 id="to-order" className="text-lg font-bold">
          To order: {countOf(toOrder.lineCount, 'part')}, {money(toOrder.totalMinor)}
        </h2>
        <p className="muted max-w-prose text-sm">
          A part is listed when its stock, with what is already on order, would not cover its reorder point, the members waiting for it,
          and what it sells while a delivery is on its way: sales of the last 90 days ÷ 90 × the supplier’s lead time in days, rounded up.
          Quantities are rounded up to whole packs.
        </p>
        {toOrder.groups.length === 0 ? <p className="card">Nothing needs ordering.</p> : null}
        {toOrder.groups.map((g) => (
          <article key={g.supplierId ?? 'none'} className="card space-y-3" aria-label={g.supplierName}>
            <header className="flex flex-wrap items-baseline justify-between gap-2">
              <h3 className="text-base font-bold">{g.supplierName}</h3>
              <p className="text-sm">
                {g.supplierId ? `${countOf(g.leadDays, 'day')} lead time · ` : ''}
                <strong>{money(g.totalMinor)}</strong>
              </p>
            </header>
            {g.belowMinimum ? (
              <p className="text-sm font-semibold text-amber-900 dark:text-amber-200">
                Below this supplier’s minimum order of {money(g.minOrderMinor)}.
              </p>
            ) : null}
            <ul className="divide-y divide-stone-200 dark:divide-stone-800">
              {g.lines.map((l) => (
                <li key={l.partId} className="py-2 text-sm">
                  <div className="flex flex-wrap justify-between gap-x-3">
                    <Link href={`/shelf/parts/${l.partId}`} className="font-semibold break-words">
                      {l.name}
                    </Link>
                    <span>
                      {l.packs} × pack of {formatQty(l.packSize, l.saleUnit)} = {formatQty(l.units, l.saleUnit)}
                      {l.packPriceMinor !== null ? ` · ${money(l.lineTotalMinor)}` : ''}
                    </span>
                  </div>
                  <p className="muted">
                    {formatQty(l.onHand, l.saleUnit)} on hand
                    {l.onOrder ? `, ${formatQty(l.onOrder, l.saleUnit)} on order` : ''}, reorder at{' '}
                    {formatQty(l.reorderPoint, l.saleUnit)}
                    {l.leadDemand ? `, about ${l.leadDemand} sold over the lead time` : ''}
                    {l.unmetHolds ? `, ${l.unmetHolds} more wanted by members waiting` : ''} — {l.reasons.map((r) => REASON_WORDS[r]).join('; ')}
                  </p>
                </li>
              ))}
            </ul>
            {g.supplierId ? (
              <StartOrder supplierId={g.supplierId} supplierName={g.supplierName} lines={g.lines.map((l) => ({ partId: l.partId, packs: l.packs }))} />
            ) : (
              <p className="text-sm">
                These parts have no offer from any supplier yet. <Link href="/orders/suppliers">Add one</Link>.
              </p>
            )}
          </article>
        ))}
      </section>

      <section aria-labelledby="lists" className="space-y-3">
        <h2 id="lists" className="text-lg font-bold">
          Order lists
        </h2>
        {orders.length === 0 ? <p className="card">No order lists yet.</p> : null}
        <ul className="space-y-2">
          {orders.map((o) => (
            <li key={o.id}>
              <Link href={`/orders/${o.id}`} className="card block no-underline">
                <span className="flex flex-wrap justify-between gap-x-3">
                  <strong>{o.supplierName}</strong>
                  <span>{formatMoney(o.totalMinor, o.currency)}</span>
                </span>
                <span className="muted block text-sm">
                  {ORDER_STATE_WORDS[o.state]} · {countOf(o.lineCount, 'line')}
                  {o.sentAt ? ` · sent ${formatDate(o.sentAt, timeZone)}` : ` · started ${formatDate(o.createdAt, timeZone)}`}
                  {o.overdue && o.expectedAt ? (
                    <span className="font-semibold text-red-800 dark:text-red-300"> · overdue since {formatDate(o.expectedAt, timeZone)}</span>
                  ) : null}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
