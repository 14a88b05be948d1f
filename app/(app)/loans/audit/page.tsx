import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { formatDateTime } from '@/lib/format';
import { auditLine } from '@/lib/loans/audit-words';
import { loanAudit } from '@/lib/loans/queries';
import { loanSettings } from '@/lib/loans/settings';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Loans audit trail' };

const ACTIONS: Record<string, string> = {
  'loan.created': 'Lent',
  'loan.override': 'Check overridden',
  'loan.returned': 'Returned',
  'loan.renewed': 'Renewed',
  'hold.placed': 'Hold placed',
  'hold.cancelled': 'Hold cancelled',
  'reminder.sent': 'Reminder sent',
  'reminder.failed': 'Reminder not sent',
  'kit_box.built': 'Box built',
  'kit_box.refilled': 'Box refilled',
  'kit_box.taken_out': 'Taken out of a box',
  'kit_box.unit_swapped': 'Unit swapped in a box',
  'kit_box.taken_apart': 'Box taken apart',
  'kit_template.created': 'Kit created',
  'kit_template.updated': 'Kit edited',
};

export default async function LoanAuditPage({
  searchParams,
}: {
  searchParams: Promise<{ action?: string; before?: string }>;
}) {
  const ctx = await requirePageRole('steward', 'admin');
  const sp = await searchParams;
  const action = sp.action && ACTIONS[sp.action] ? sp.action : undefined;
  const before = sp.before && /^\d{1,18}$/.test(sp.before) ? sp.before : undefined;
  const [rows, { timeZone }] = await Promise.all([
    loanAudit(db, ctx, { action, before, limit: 100 }),
    loanSettings(db, ctx.spaceId),
  ]);
  return (
    <div className="space-y-4">
      <PageTitle
        title="Loans audit trail"
        lead="Every loan, return, override, hold, renewal and reminder, newest first."
      />
      <nav aria-label="Filter by action">
        <ul className="flex flex-wrap gap-2 text-sm">
          <li>
            <Link href="/loans/audit" aria-current={!action ? 'page' : undefined}>
              Everything
            </Link>
          </li>
          {Object.entries(ACTIONS).map(([k, label]) => (
            <li key={k}>
              <Link href={`/loans/audit?action=${k}`} aria-current={action === k ? 'page' : undefined}>
                {label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      <div className="overflow-x-auto">
        <table className="table-dense">
          <thead>
            <tr>
              <th scope="col">When</th>
              <th scope="col">What</th>
              <th scope="col">Who</th>
              <th scope="col">Details</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <td className="whitespace-nowrap">{formatDateTime(r.at, timeZone)}</td>
                <td>
                  {r.targetType === 'loan' && r.targetId ? (
                    <Link href={`/loans/${r.targetId}`}>{ACTIONS[r.action] ?? r.action}</Link>
                  ) : r.targetType === 'kit_box' && r.targetId ? (
                    <Link href={`/kits/boxes/${r.targetId}`}>{ACTIONS[r.action] ?? r.action}</Link>
                  ) : (
                    (ACTIONS[r.action] ?? r.action)
                  )}
                </td>
                <td>{r.actor ?? 'scheduled job'}</td>
                <td>{auditLine(r, timeZone)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length === 100 ? (
        <Link
          href={`/loans/audit?${new URLSearchParams({ ...(action ? { action } : {}), before: rows[rows.length - 1].id })}`}
        >
          Older entries
        </Link>
      ) : null}
    </div>
  );
}
