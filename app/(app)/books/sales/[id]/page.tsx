import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { NotFoundError } from '@/lib/errors';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import type { BooksRow } from '@/lib/reconcile/report';
import { reconcileForBooks } from '@/lib/reconcile/run';
import { isClosedAt, monthOf, spaceClock } from '@/lib/sales/periods';
import { saleView } from '@/lib/sales/read';
import { saleRef } from '@/lib/sales/ref';
import { taxWords } from '@/lib/sales/tax';
import { CopyText } from '@/components/books/copy-text';
import { ProcessorRefs } from '@/components/books/processor-refs';
import { ReconStatusBadge } from '@/components/books/recon-status';
import { RefundForm } from '@/components/books/refund-form';
import { ResolveRow } from '@/components/books/resolve-row';
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
  // The sale beside the processor: its rows in its month's reconciliation (charge and refunds).
  const month = monthOf(new Date(when), timeZone);
  let rows: BooksRow[] = [];
  let ledgerProblem: string | null = null;
  if (sale.method === 'card' && sale.paidAt) {
    try {
      rows = (await reconcileForBooks(ctx, month)).rows.filter((r) => r.saleId === sale.id);
    } catch (err) {
      ledgerProblem = err instanceof Error ? err.message : String(err);
    }
  }
  return (
    <div className="space-y-5">
      <PageTitle
        title={`Sale ${saleRef(sale.id)}`}
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
          <dt className="muted">Tax</dt>
          <dd data-testid="sale-tax">
            {sale.tax.mode === 'exempt'
              ? 'none'
              : `${money(sale.tax.taxMinor)} · ${taxWords(sale.tax.name, { mode: sale.tax.mode, rateBp: sale.tax.rateBp })}`}
          </dd>
          <dt className="muted">{sale.channel === 'honour_box' ? 'Recorded at the honour box by' : 'Rung up by'}</dt>
          <dd>{sale.cashier ?? '—'}</dd>
          <dt className="muted">Full sale id</dt>
          <dd>
            <CopyText label="the full sale id" value={sale.id} />
          </dd>
          <dt className="muted">Processor’s payment</dt>
          <dd>
            {sale.paymentIntentId ? (
              <CopyText label="the processor’s payment reference" value={sale.paymentIntentId} />
            ) : (
              '—'
            )}
          </dd>
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
      {rows.length || ledgerProblem ? (
        <section className="card space-y-3" aria-labelledby="beside">
          <h2 id="beside" className="text-lg font-bold">
            Beside the processor
          </h2>
          {ledgerProblem ? (
            <p role="alert">The processor’s records could not be read right now. {ledgerProblem}</p>
          ) : null}
          {rows.map((r) => (
            <div
              key={r.key}
              className="space-y-2 border-t border-stone-200 pt-2 first:border-t-0 first:pt-0 dark:border-stone-700"
              data-status={r.status}
            >
              <p className="flex flex-wrap items-center gap-2">
                <ReconStatusBadge status={r.status} />
                <span>{r.kind === 'charge' ? 'Sale payment' : 'Refund'}</span>
                <span className="muted text-sm">{formatDateTime(r.at, timeZone)}</span>
              </p>
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
                <dt className="muted">Our books</dt>
                <dd className="tabular-nums" data-testid="our-amount">
                  {r.oursMinor === null ? '—' : money(r.oursMinor)}
                </dd>
                <dt className="muted">Processor</dt>
                <dd className="tabular-nums" data-testid="processor-amount">
                  {r.theirsMinor === null ? '—' : money(r.theirsMinor)}
                </dd>
                <dt className="muted">Difference</dt>
                <dd className="font-bold tabular-nums" data-testid="difference">
                  {r.differenceMinor ? money(r.differenceMinor) : '—'}
                </dd>
                <dt className="muted">Their ids</dt>
                <dd>
                  <ProcessorRefs paymentRef={r.processorId} ledgerRef={r.txnId} />
                </dd>
              </dl>
              {r.note ? <p className="text-sm">{r.note}</p> : null}
              {r.status === 'matched' ? null : (
                <ResolveRow month={month} rowKey={r.key} resolution={r.resolution} timeZone={timeZone} />
              )}
            </div>
          ))}
        </section>
      ) : null}
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
