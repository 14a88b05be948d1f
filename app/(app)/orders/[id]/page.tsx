import Link from 'next/link';
import { db } from '@/db';
import { LAYOUTS } from '@/labels/layouts';
import { requirePageRole } from '@/lib/auth/guard';
import { hasRole } from '@/lib/auth/roles';
import { formatDate, formatDateTime } from '@/lib/format';
import { chooseLayout } from '@/lib/inventory/labels';
import { listLocations } from '@/lib/inventory/locations';
import { formatMoney } from '@/lib/money';
import { ORDER_STATE_WORDS } from '@/lib/restock/order-words';
import { orderDetail } from '@/lib/restock/orders';
import { spaceClock } from '@/lib/sales/periods';
import { PageTitle } from '@/components/ui/page-title';
import { notFoundUnlessFound } from '@/components/shelf/not-found';
import { OrderWork } from '@/components/restock/order-work';
import { formatQty } from '@/lib/inventory/measure';

export const metadata = { title: 'Order list' };

export default async function OrderPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageRole('steward', 'admin');
  const { id } = await params;
  const order = await notFoundUnlessFound(orderDetail(db, ctx, id));
  const [locations, layoutId, { timeZone }] = await Promise.all([listLocations(db, ctx), chooseLayout(db, ctx), spaceClock(db, ctx.spaceId)]);
  const money = (n: number) => formatMoney(n, order.currency);
  return (
    <div className="space-y-4">
      <Link href="/orders" className="inline-block min-h-11 content-center text-sm">
        ← Restock
      </Link>
      <PageTitle title={`Order list to ${order.supplier.name}`} lead={ORDER_STATE_WORDS[order.state]}>
        <a href={`/api/orders/${order.id}/pdf`} className="btn-quiet" target="_blank" rel="noreferrer">
          Printable list (PDF)
        </a>
      </PageTitle>
      <section className="card space-y-2" aria-labelledby="about">
        <h2 id="about" className="text-lg font-bold">
          {money(order.totalMinor)} as ordered
          {order.receivedCostMinor ? ` · ${money(order.receivedCostMinor)} received at the price paid` : ''}
        </h2>
        <p className="text-sm break-words">
          {order.supplier.email || 'No contact e-mail'} · {order.supplier.leadDays} days’ lead time
          {order.sentAt ? ` · sent ${formatDate(order.sentAt, timeZone)}` : ''}
          {order.expectedAt ? ` · expected by ${formatDate(order.expectedAt, timeZone)}` : ''}
        </p>
        {order.overdue ? <p className="font-semibold text-red-800 dark:text-red-300">Overdue: past the supplier’s lead time.</p> : null}
        {order.approvalNote ? <p className="text-sm">Approved past the budget: {order.approvalNote}</p> : null}
        {order.cancelNote ? <p className="text-sm">Called off: {order.cancelNote}</p> : null}
        {order.note ? <p className="text-sm">Note: {order.note}</p> : null}
        <ul className="divide-y divide-stone-200 dark:divide-stone-800">
          {order.lines.map((l) => (
            <li key={l.id} className="py-2 text-sm">
              <div className="flex flex-wrap justify-between gap-x-3">
                <span className="font-semibold break-words">{l.partName}</span>
                <span>{money(l.lineTotalMinor)}</span>
              </div>
              <p className="muted">
                {l.packs} × pack of {formatQty(l.packSize, l.saleUnit)} at {money(l.packPriceMinor)}
                {l.itemRef ? ` · their ref. ${l.itemRef}` : ''} · {formatQty(l.receivedUnits, l.saleUnit)} of{' '}
                {formatQty(l.orderedUnits, l.saleUnit)} arrived
              </p>
            </li>
          ))}
        </ul>
        {order.receipts.length ? (
          <div>
            <h3 className="font-semibold">Arrivals</h3>
            <ul className="text-sm">
              {order.receipts.map((r) => (
                <li key={r.id}>
                  {formatDateTime(r.receivedAt, timeZone)}: {formatQty(r.units)} {r.units === 1 ? 'unit' : 'units'}, {money(r.costMinor)}
                  {r.by ? ` (${r.by})` : ''}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
      </section>
      <OrderWork
        orderId={order.id}
        state={order.state}
        currency={order.currency}
        lines={order.lines.map((l) => ({
          id: l.id,
          partId: l.partId,
          partName: l.partName,
          tracking: l.tracking,
          saleUnit: l.saleUnit,
          packSize: l.packSize,
          packs: l.packs,
          orderedUnits: l.orderedUnits,
          receivedUnits: l.receivedUnits,
          packPriceMinor: l.packPriceMinor,
        }))}
        locations={locations.map((l) => ({ id: l.id, name: l.name }))}
        isAdmin={hasRole(ctx, 'admin')}
        labels={{ layouts: LAYOUTS.map((l) => ({ id: l.id, name: l.name })), defaultLayout: layoutId }}
      />
    </div>
  );
}
