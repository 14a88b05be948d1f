import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { now } from '@/lib/clock';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { salesByMonthAndCategory } from '@/lib/reconcile/chart';
import { latestActiveMonth, notBegun, readMonth } from '@/lib/reconcile/months';
import { isUnresolved, type Reconciliation } from '@/lib/reconcile/report';
import { filingForBooks } from '@/lib/reconcile/run';
import { FilingSummary } from '@/components/books/filing-summary';
import { salesOfMonth } from '@/lib/reconcile/sales-list';
import { spendBesideSales } from '@/lib/restock/spend';
import { monthLabel, monthOf, monthRange, shiftMonth, spaceClock } from '@/lib/sales/periods';
import { countOverdueSales } from '@/lib/sales/sweep';
import { CloseMonth } from '@/components/books/close-month';
import { ProcessorRefs } from '@/components/books/processor-refs';
import { ReconTable } from '@/components/books/recon-table';
import { SalesChart } from '@/components/books/sales-chart';
import { SalesTable } from '@/components/books/sales-table';
import { SpendBesideSales } from '@/components/books/spend-beside-sales';
import { Margins } from '@/components/books/margins';
import { marginsOfMonth } from '@/lib/books/margins-month';
import { SweepButton } from '@/components/books/sweep-button';
import { ToInvestigate } from '@/components/books/to-investigate';
import { Totals } from '@/components/books/totals';
import { ChargesMonth } from '@/components/books/charges-month';
import { chargesOfMonth } from '@/lib/charges/month';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Books' };
export const dynamic = 'force-dynamic';

export default async function BooksPage({
  searchParams,
}: {
  searchParams: Promise<{ month?: string | string[] }>;
}) {
  const ctx = await requirePageRole('treasurer');
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  // Without a month: the latest with sales or refunds. A month that is not one, or has not begun,
  // is said so plainly (never silently swapped for another).
  const asked = readMonth((await searchParams).month);
  const thisMonth = monthOf(now(), timeZone);
  const latest = await latestActiveMonth(db, ctx.spaceId, now());
  if (!asked.ok || (asked.month && asked.month > thisMonth))
    return (
      <div className="space-y-5">
        <PageTitle title="Books" lead={`${ctx.spaceName}, in ${currency}; months run on ${timeZone} time.`} />
        <div className="card space-y-3">
          <p role="alert" className="font-semibold">
            {asked.ok ? notBegun(asked.month!) : asked.message}
          </p>
          <Link href={`/books?month=${latest}`} className="btn-primary">
            Open {monthLabel(latest)}
          </Link>
        </div>
      </div>
    );
  const month = asked.month ?? latest;
  const label = monthLabel(month);
  const next = shiftMonth(month, 1);

  // Looking at the books changes nothing: card sales left waiting past their expiry are counted here
  // and settled by the sweep button (a POST), the processor's own expiry events and the status page.
  const waiting = await countOverdueSales(db, { spaceId: ctx.spaceId, now: now() });
  let report: Reconciliation | null = null;
  let filed: Awaited<ReturnType<typeof filingForBooks>> | null = null;
  let ledgerProblem: string | null = null;
  try {
    filed = await filingForBooks(ctx, month);
    report = filed.report;
  } catch (err) {
    ledgerProblem = err instanceof Error ? err.message : String(err);
  }
  const sales = await salesOfMonth(db, ctx.spaceId, month);
  const chart = await salesByMonthAndCategory(db, ctx.spaceId, month, 12);
  const spend = await spendBesideSales(db, ctx, month);
  const margins = await marginsOfMonth(db, ctx, month);
  const chargeMonth = await chargesOfMonth(db, ctx.spaceId, monthRange(month, timeZone));
  const ended = monthRange(month, timeZone).to <= now();
  const unresolved = report ? report.rows.filter(isUnresolved) : [];

  return (
    <div className="space-y-5">
      <PageTitle
        title={`Books · ${label}`}
        lead={`${ctx.spaceName}, in ${currency}; months run on ${timeZone} time.`}
      >
        <Link href={`/books?month=${shiftMonth(month, -1)}`} className="btn-quiet">
          ← {monthLabel(shiftMonth(month, -1))}
        </Link>
        {next <= thisMonth ? (
          <Link href={`/books?month=${next}`} className="btn-quiet">
            {monthLabel(next)} →
          </Link>
        ) : null}
        <a href={`/api/books/export?month=${month}`} className="btn-primary" download>
          Rows as CSV
        </a>
        <a href={`/api/books/export?month=${month}&part=totals`} className="btn-quiet" download>
          Totals as CSV
        </a>
      </PageTitle>

      {waiting > 0 ? <SweepButton waiting={waiting} /> : null}

      <section aria-labelledby="recon" className="card space-y-4">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <h2 id="recon" className="text-lg font-bold">
            Our books beside the processor
          </h2>
          {report?.closed ? (
            <p className="text-sm font-semibold" data-testid="month-closed">
              Closed on {formatDateTime(report.closed.closedAt, timeZone)}
              {report.closed.closedBy ? ` by ${report.closed.closedBy}` : ''}. Changes now go in as reversing
              entries.
            </p>
          ) : report && ended ? (
            <CloseMonth month={month} label={label} unresolved={unresolved} currency={currency} />
          ) : null}
        </div>
        {report ? (
          <>
            <Totals totals={report.totals} currency={currency} unresolved={report.unresolved} />
            <ReconTable month={month} rows={report.rows} currency={currency} timeZone={timeZone} />
            <ToInvestigate items={report.investigate} timeZone={timeZone} />
            {report.payouts.length ? (
              <div>
                <h3 className="font-semibold">Sent to our bank</h3>
                <ul className="text-sm">
                  {report.payouts.map((p) => (
                    <li key={p.id ?? p.at}>
                      {formatDateTime(p.at, timeZone)}: {formatMoney(p.amountMinor, currency)}
                      {p.id ? <ProcessorRefs paymentRef={p.id} ledgerRef={null} /> : null}
                    </li>
                  ))}
                </ul>
              </div>
            ) : null}
          </>
        ) : (
          <p role="alert">
            The processor’s ledger could not be read, so this month cannot be reconciled right now.{' '}
            {ledgerProblem}
          </p>
        )}
      </section>

      {filed ? (
        <section aria-labelledby="filing" className="card space-y-3">
          <h2 id="filing" className="text-lg font-bold">
            For the association’s books
          </h2>
          <FilingSummary totals={filed.totals} filing={filed.filing} currency={currency} timeZone={timeZone} month={month} />
        </section>
      ) : null}

      <section aria-labelledby="sales" className="card space-y-3">
        <h2 id="sales" className="text-lg font-bold">
          Sales of {label}
        </h2>
        <p className="muted text-sm">
          Open a sale to refund it (all of it or some lines, with or without putting the items back).
        </p>
        <SalesTable sales={sales} currency={currency} timeZone={timeZone} />
      </section>

      <SpendBesideSales rows={spend.rows} currency={spend.currency} label={label} month={month} />

      <Margins rows={margins.rows} currency={margins.currency} label={label} />

      <ChargesMonth month={chargeMonth} currency={currency} label={label} />

      <section aria-labelledby="chart" className="card space-y-3">
        <h2 id="chart" className="text-lg font-bold">
          Sales by month and category
        </h2>
        <SalesChart points={chart.points} categories={chart.categories} currency={currency} />
        <details>
          <summary className="cursor-pointer font-semibold">The same figures as a table</summary>
          <div className="overflow-x-auto">
            <table className="table-dense mt-2">
              <thead>
                <tr>
                  <th scope="col">Month</th>
                  {chart.categories.map((c) => (
                    <th key={c} scope="col">
                      {c.replaceAll('_', ' ')}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {chart.points.map((p) => (
                  <tr key={p.month}>
                    <th scope="row">{p.month}</th>
                    {chart.categories.map((c) => (
                      <td key={c} className="tabular-nums">
                        {formatMoney(Number(p[c] ?? 0), currency)}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      </section>
    </div>
  );
}
