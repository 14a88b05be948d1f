import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { NotFoundError } from '@/lib/errors';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { isClosedAt, monthOf, spaceClock } from '@/lib/sales/periods';
import { saleView } from '@/lib/sales/read';
import { RefundForm } from '@/components/books/refund-form';
import { SaleRef } from '@/components/books/sale-ref';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';

export const metadata = { title: 'Sale' };

export default async function BookSalePage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageRole('treasurer');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const sale = await saleView(db, ctx, id).catch((err: unknown) => {
    if (err instanceof NotFoundError) notFound();
    throw err;
  });
  const { timeZone } = await spaceClock(db, ctx.spaceId);
  const money = (n: number) => formatMoney(n, sale.currency);
  const when = sale.paidAt ?? sale.createdAt;
  const closed = await isClosedAt(db, ctx.spaceId, new Date(when));
  const refundable = ['paid', 'partially_refunded'].includes(sale.status);
  return (
    <div className="space-y-5">
      <PageTitle
        title={`Sale ${sale.id.slice(0, 8).toUpperCase()}`}
        lead={`${sale.method === 'card' ? 'Card' : 'Cash'} sale to ${sale.buyer ?? 'someone no longer here'}`}
      >
        <Link href={`/books?month=${monthOf(new Date(when), timeZone)}`} className="btn-quiet">
          Back to the books
        </Link>
      </PageTitle>
      <section className="card space-y-2" aria-label="The sale">
        <p className="flex flex-wrap items-center gap-2">
          <StatePill state={sale.status} /> {money(sale.totalMinor)}
          {sale.refundedMinor ? <span className="muted">· refunded {money(sale.refundedMinor)}</span> : null}
        </p>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="muted">Started</dt>
          <dd>{formatDateTime(sale.createdAt, timeZone)}</dd>
          <dt className="muted">Paid</dt>
          <dd>{sale.paidAt ? formatDateTime(sale.paidAt, timeZone) : '—'}</dd>
          <dt className="muted">Rung up by</dt>
          <dd>{sale.cashier ?? '—'}</dd>
          <dt className="muted">Processor payment</dt>
          <dd className="font-mono">{sale.paymentIntentId ?? '—'}</dd>
          {sale.reversesSaleId ? (
            <>
              <dt className="muted">Reverses</dt>
              <dd>
                <SaleRef id={sale.reversesSaleId} />
              </dd>
            </>
          ) : null}
        </dl>
        {sale.refunds.length ? (
          <ul className="text-sm">
            {sale.refunds.map((r) => (
              <li key={r.id}>
                Refund of {money(r.amountMinor)} on {formatDateTime(r.createdAt, timeZone)}
                {r.restock ? ', items back on the shelf' : ''}
                {r.bookedOn !== sale.id ? (
                  <>
                    {' '}
                    (reversing entry <SaleRef id={r.bookedOn} />)
                  </>
                ) : null}
              </li>
            ))}
          </ul>
        ) : null}
      </section>
      {refundable ? (
        <section className="card space-y-3" aria-labelledby="refund">
          <h2 id="refund" className="text-lg font-bold">
            Refund
          </h2>
          <RefundForm sale={sale} closedMonth={closed} />
        </section>
      ) : null}
    </div>
  );
}
