import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { formatDateTime } from '@/lib/format';
import { loansPerWeek, overdueRound } from '@/lib/loans/queries';
import { LoansChart } from '@/components/loans/loans-chart';
import { RoundTable } from '@/components/loans/round-table';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Overdue round' };

export default async function RoundPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [{ rows, timeZone }, weeks] = await Promise.all([overdueRound(db, ctx), loansPerWeek(db, ctx)]);
  const items = rows
    .sort((a, b) => b.daysLate - a.daysLate)
    .map((r) => ({
      id: r.id,
      title: r.title,
      daysLate: r.daysLate,
      due: formatDateTime(r.dueAt, timeZone),
      borrowerName: r.borrower.name,
      borrowerEmail: r.borrower.email,
      lines: r.lines,
      lastReminder: r.lastReminder ? formatDateTime(r.lastReminder, timeZone) : null,
      reminders: r.reminders,
    }));
  return (
    <div className="space-y-6">
      <PageTitle
        title="Overdue round"
        lead="Loans past their due date, most days late first. Scheduled reminders go out by themselves; send one now when it helps."
      >
        <Link href="/shelf/repairs" className="btn-quiet">
          Repair queue
        </Link>
        <Link href="/loans/audit" className="btn-quiet">
          Audit trail
        </Link>
      </PageTitle>
      <section aria-labelledby="overdue-h" className="space-y-2">
        <h2 id="overdue-h" className="text-lg font-bold">
          Overdue ({items.length})
        </h2>
        <RoundTable items={items} />
      </section>
      <section aria-labelledby="chart-h" className="card">
        <h2 id="chart-h" className="text-lg font-bold">
          Loans out and overdue, last 12 weeks
        </h2>
        <LoansChart points={weeks} />
      </section>
    </div>
  );
}
