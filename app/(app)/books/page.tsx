import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { now } from '@/lib/clock';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { salesByMonthAndCategory } from '@/lib/reconcile/chart';
import type { Reconciliation } from '@/lib/reconcile/report';
import { monthOrCurrent, reconcileForBooks } from '@/lib/reconcile/run';
import { salesOfMonth } from '@/lib/reconcile/sales-list';
import { monthLabel, monthRange, shiftMonth, spaceClock } from '@/lib/sales/periods';
import { monthInput } from '@/lib/sales/schemas';
import { countOverdueSales } from '@/lib/sales/sweep';
import { CloseMonth } from '@/components/books/close-month';
import { ReconTable } from '@/components/books/recon-table';
import { SalesChart } from '@/components/books/sales-chart';
import { SalesTable } from '@/components/books/sales-table';
import { SweepButton } from '@/components/books/sweep-button';
import { ToInvestigate } from '@/components/books/to-investigate';
import { Totals } from '@/components/books/totals';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Books' };
export const dynamic = 'force-dynamic';

export default async function BooksPage({ searchParams }: { searchParams: Promise<{ month?: string }> }) {
  const ctx = await requirePageRole('treasurer');
  const asked = monthInput.safeParse((await searchParams).month);
  const month = await monthOrCurrent(ctx, asked.success ? asked.data : undefined);
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  const label = monthLabel(month);

  // Looking at the books changes nothing: card sales left waiting past their expiry are counted here
  // and settled by the sweep button (a POST), the processor's own expiry events and the status page.
  const waiting = await countOverdueSales(db, { spaceId: ctx.spaceId, now: now() });
  let report: Reconciliation | null = null;
  let ledgerProblem: string | null = null;
  try {
    report = await reconcileForBooks(ctx, month);
  } catch (err) {
    ledgerProblem = err instanceof Error ? err.message : String(err);
  }
  const sales = await salesOfMonth(db, ctx.spaceId, month);
  const chart = await salesByMonthAndCategory(db, ctx.spaceId, month, 12);
  const ended = monthRange(month, timeZone).to <= now();
  const problems = report ? report.rows.filter((r) => r.status !== 'matched').length : 0;

  return (
    <div className="space-y-5">
      <PageTitle
        title={`Books · ${label}`}
        lead={`${ctx.spaceName}, in ${currency}; months run on ${timeZone} time.`}
      >
        <Link href={`/books?month=${shiftMonth(month, -1)}`} className="btn-quiet">
          ← {monthLabel(shiftMonth(month, -1))}
        </Link>
        <Link href={`/books?month=${shiftMonth(month, 1)}`} className="btn-quiet">
          {monthLabel(shiftMonth(month, 1))} →
        </Link>
        <a href={`/api/books/export?month=${month}`} className="btn-primary" download>
          Export CSV
        </a>
      </PageTitle>

      {waiting > 0 ? <SweepButton waiting={waiting} /> : null}

      <section aria-labelledby="recon" className="card space-y-4">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <h2 id="recon" className="text-lg font-bold">
            Reconciliation
          </h2>
          {report?.closed ? (
            <p className="text-sm font-semibold" data-testid="month-closed">
              Closed on {formatDateTime(report.closed.closedAt, timeZone)}
              {report.closed.closedBy ? ` by ${report.closed.closedBy}` : ''}. Changes now go in as reversing
              entries.
            </p>
          ) : report && ended ? (
            <CloseMonth month={month} label={label} problems={problems} />
          ) : null}
        </div>
        {report ? (
          <>
            <Totals totals={report.totals} currency={currency} />
            <ReconTable rows={report.rows} currency={currency} timeZone={timeZone} />
            <ToInvestigate items={report.investigate} timeZone={timeZone} />
            {report.payouts.length ? (
              <div>
                <h3 className="font-semibold">Payouts to the bank</h3>
                <ul className="text-sm">
                  {report.payouts.map((p) => (
                    <li key={p.id ?? p.at}>
                      {formatDateTime(p.at, timeZone)}: {formatMoney(p.amountMinor, currency)}{' '}
                      <span className="muted font-mono text-xs">{p.id}</span>
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

      <section aria-labelledby="sales" className="card space-y-3">
        <h2 id="sales" className="text-lg font-bold">
          Sales of {label}
        </h2>
        <p className="muted text-sm">
          Open a sale to refund it (all of it or some lines, with or without putting the items back).
        </p>
        <SalesTable sales={sales} currency={currency} timeZone={timeZone} />
      </section>

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
