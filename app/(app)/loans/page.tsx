import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { listHolds, listLoans, type LoanFilter } from '@/lib/loans/queries';
import { loanSettings } from '@/lib/loans/settings';
import { ActionButton } from '@/components/loans/action-button';
import { CalendarLink } from '@/components/loans/calendar-link';
import { LoanList } from '@/components/loans/loan-list';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Loans' };

const FILTERS: { key: LoanFilter; label: string }[] = [
  { key: 'out', label: 'Out' },
  { key: 'overdue', label: 'Overdue' },
  { key: 'returned', label: 'Returned' },
  { key: 'all', label: 'All' },
];

export default async function LoansPage({
  searchParams,
}: {
  searchParams: Promise<{ status?: string; mine?: string }>;
}) {
  const ctx = await requirePageUser();
  const sp = await searchParams;
  const staff = isStaff(ctx);
  const { timeZone } = await loanSettings(db, ctx.spaceId);
  const holds = await listHolds(db, ctx, { all: staff });

  if (!staff || sp.mine === '1') {
    const [out, history] = await Promise.all([
      listLoans(db, ctx, 'out', { mine: true }),
      listLoans(db, ctx, 'returned', { mine: true, limit: 50 }),
    ]);
    return (
      <div className="mx-auto max-w-2xl space-y-6">
        <PageTitle title="My loans" lead="What you have out, when it is due, and what you are waiting for.">
          <Link href="/loans/new" className="btn-quiet">
            Borrow loose parts
          </Link>
          {staff ? (
            <Link href="/loans" className="btn-quiet">
              Everyone’s loans
            </Link>
          ) : null}
        </PageTitle>
        <section aria-labelledby="out-h" className="space-y-2">
          <h2 id="out-h" className="text-lg font-bold">
            Out now
          </h2>
          <LoanList
            loans={out}
            timeZone={timeZone}
            showBorrower={false}
            empty="Nothing out in your name. Scan a kit box to borrow it."
          />
        </section>
        <HoldList holds={holds} mine />
        <section aria-labelledby="cal-h" className="card space-y-2">
          <h2 id="cal-h" className="text-lg font-bold">
            Due dates in your calendar
          </h2>
          <CalendarLink />
        </section>
        <section aria-labelledby="hist-h" className="space-y-2">
          <h2 id="hist-h" className="text-lg font-bold">
            History
          </h2>
          <LoanList loans={history} timeZone={timeZone} showBorrower={false} empty="No returned loans yet." />
        </section>
      </div>
    );
  }

  const filter = FILTERS.find((f) => f.key === sp.status)?.key ?? 'out';
  const loans = await listLoans(db, ctx, filter);
  return (
    <div className="space-y-6">
      <PageTitle title="Loans" lead="Everything out, overdue and back.">
        <Link href="/loans/round" className="btn-primary">
          Overdue round
        </Link>
        <Link href="/loans/new" className="btn-quiet">
          Lend loose parts
        </Link>
        <Link href="/loans/audit" className="btn-quiet">
          Audit trail
        </Link>
        <Link href="/loans?mine=1" className="btn-quiet">
          My loans
        </Link>
      </PageTitle>
      <nav aria-label="Filter loans">
        <ul className="flex flex-wrap gap-2">
          {FILTERS.map((f) => (
            <li key={f.key}>
              <Link
                href={`/loans?status=${f.key}`}
                aria-current={f.key === filter ? 'page' : undefined}
                className={f.key === filter ? 'btn-primary' : 'btn-quiet'}
              >
                {f.label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      <LoanList loans={loans} timeZone={timeZone} showBorrower empty="No loans here." />
      <HoldList holds={holds} mine={false} />
      <p>
        <Link href="/shelf/repairs">Repair queue</Link> — units waiting for repair; boxes that came back short
        show “in repair” under <Link href="/kits">Kits</Link>.
      </p>
    </div>
  );
}

function HoldList({ holds, mine }: { holds: Awaited<ReturnType<typeof listHolds>>; mine: boolean }) {
  return (
    <section aria-labelledby="holds-h" className="space-y-2">
      <h2 id="holds-h" className="text-lg font-bold">
        {mine ? 'My holds' : 'Holds'}
      </h2>
      {holds.length === 0 ? (
        <p className="muted">
          {mine
            ? 'You are not waiting for anything. Hold a box from its page when it is out.'
            : 'Nobody is waiting for anything.'}
        </p>
      ) : (
        <ul className="space-y-2">
          {holds.map((h) => (
            <li key={h.id} className="card flex flex-wrap items-center justify-between gap-2">
              <span>
                {h.kitBoxId ? <Link href={`/kits/boxes/${h.kitBoxId}`}>{h.itemName}</Link> : h.itemName}
                <span className="muted block text-sm">
                  {mine ? '' : `${h.userName} · `}
                  {h.status === 'ready' ? 'ready to collect' : `number ${h.position} in the queue`}
                </span>
              </span>
              <ActionButton
                url={`/api/holds/${h.id}`}
                method="DELETE"
                label="Cancel hold"
                busyLabel="Cancelling…"
              />
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
