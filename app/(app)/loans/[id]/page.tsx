import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { formatDateTime } from '@/lib/format';
import { getLoan } from '@/lib/loans/queries';
import { formatMoney } from '@/lib/money';
import { spaceClock } from '@/lib/sales/periods';
import { Cautions } from '@/components/kits/cautions';
import { CheckReport } from '@/components/kits/check-report';
import { ActionButton } from '@/components/loans/action-button';
import { ReturnForm } from '@/components/loans/return-form';
import { StatePill } from '@/components/ui/state-pill';
import { orNotFound, pageId } from '../or-not-found';
import { displayCode } from '@/labels/code';
import { chainRoleWords } from '@/lib/domain';
import { LoanMoneyCard } from '@/components/loans/loan-money';
import { PayChargesByCard } from '@/components/charges/pay-by-card';
import { owedBy } from '@/lib/charges/owed';

export const metadata = { title: 'Loan' };

const CONDITION: Record<string, string> = { ok: 'back', missing: 'missing', damaged: 'damaged' };

export default async function LoanPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageUser();
  const loan = await orNotFound(async () => getLoan(db, ctx, pageId((await params).id)));
  const staff = isStaff(ctx);
  const tz = loan.timeZone;
  const depositDue = loan.status === 'waiting' && loan.deposit?.status === 'pending';
  const state = loan.status === 'out' && loan.overdue ? 'overdue' : depositDue ? 'deposit_due' : loan.status;
  const canGiveUp = loan.status === 'waiting' && (staff || loan.isMine);
  const { currency } = await spaceClock(db, ctx.spaceId);
  const owedHere = loan.charges.reduce((sum, c) => sum + c.amountMinor - c.fromDepositMinor - c.settledMinor, 0);
  // Paying by card settles everything the borrower owes, this loan's charges and any others.
  const owedInAll = owedHere > 0 && (staff || loan.isMine) ? await owedBy(db, ctx.spaceId, loan.borrower.id) : 0;
  const canRenew = loan.status === 'out' && loan.renewals < loan.maxRenewals && loan.waitingHolds === 0;
  return (
    <div className="mx-auto max-w-xl space-y-4">
      <header>
        <p className="muted text-sm">
          <Link href="/loans">Loans</Link>
          {loan.kitBox ? (
            <>
              {' '}
              · <Link href={`/kits/boxes/${loan.kitBox.id}`}>box {loan.kitBox.code}</Link>
            </>
          ) : null}
        </p>
        <div className="flex flex-wrap items-center gap-2">
          <h1 className="text-2xl font-bold tracking-tight">{loan.title}</h1>
          <StatePill state={state} />
        </div>
        <p className="mt-1">
          {loan.isMine ? 'Borrowed by you' : `Borrowed by ${loan.borrower.name}`}
          {staff && !loan.isMine ? (
            <>
              {' '}
              (<a href={`mailto:${loan.borrower.email}`}>{loan.borrower.email}</a>)
            </>
          ) : null}{' '}
          on {formatDateTime(loan.outAt, tz)}
          {loan.lentBy && loan.lentBy !== loan.borrower.name ? `, lent by ${loan.lentBy}` : ''}.
        </p>
      </header>

      <section aria-label="Due date" className="card">
        {loan.status === 'waiting' ? (
          <>
            {depositDue ? (
              <>
                <p className="text-lg">
                  Kept for {loan.isMine ? 'you' : loan.borrower.name} until the deposit is paid.
                </p>
                <p className="muted text-sm">The loan, and its due date, start once the deposit is in.</p>
                {loan.deposit?.payUrl ? (
                  <a className="btn-primary mt-2 inline-block" href={loan.deposit.payUrl}>
                    Pay the deposit
                  </a>
                ) : null}
              </>
            ) : (
              <>
                <p className="text-lg">Waiting at the bench: kept for {loan.isMine ? 'you' : loan.borrower.name} until a steward gives it to them.</p>
                <p className="muted text-sm">The loan, and its due date, start when it changes hands.</p>
                {staff ? (
                  <div className="mt-2">
                    <ActionButton
                      url={`/api/loans/${loan.id}/hand-over`}
                      label={loan.isMine ? 'I have it now: start the loan' : `Give it to ${loan.borrower.name} now`}
                      busyLabel="Starting the loan…"
                      done="Done: the loan has started."
                      variant="primary"
                    />
                  </div>
                ) : null}
              </>
            )}
            {canGiveUp ? (
              <div className="mt-3">
                <ActionButton
                  url={`/api/loans/${loan.id}/cancel`}
                  label={loan.isMine ? 'I no longer want it' : 'Give up this borrow'}
                  busyLabel="Putting it back…"
                  done="Given up: it is back for others."
                  confirm="Put everything back for others to borrow?"
                />
              </div>
            ) : null}
          </>
        ) : loan.status === 'cancelled' ? (
          <p className="text-lg">Given up before it was lent: everything went back.</p>
        ) : loan.status === 'back_unchecked' ? (
          <p className="text-lg">
            Back, not yet checked: {staff ? 'check what came back below and confirm.' : 'a steward checks what came back and confirms.'}
          </p>
        ) : loan.status === 'out' ? (
          <>
            <p className="text-lg">
              Due back <strong>{formatDateTime(loan.dueAt, tz)}</strong>
              {loan.overdue ? (
                <span className="font-semibold text-red-800 dark:text-red-300">
                  {' '}
                  · {loan.daysLate} {loan.daysLate === 1 ? 'day' : 'days'} late
                </span>
              ) : null}
            </p>
            <p className="muted text-sm">
              Renewed {loan.renewals} of {loan.maxRenewals} {loan.maxRenewals === 1 ? 'time' : 'times'}{' '}
              allowed
              {loan.waitingHolds ? ` · ${loan.waitingHolds} waiting for it` : ''}.
            </p>
            {canRenew ? (
              <div className="mt-2">
                <ActionButton
                  url={`/api/loans/${loan.id}/renew`}
                  label="Renew the loan"
                  busyLabel="Renewing…"
                  done="Renewed."
                />
              </div>
            ) : null}
          </>
        ) : (
          <p>
            Returned {loan.returnedAt ? formatDateTime(loan.returnedAt, tz) : ''}
            {loan.status === 'returned_short' ? ', with something missing or damaged.' : '.'}
          </p>
        )}
      </section>

      <LoanMoneyCard deposit={loan.deposit} charges={loan.charges} isMine={loan.isMine} />
      {owedInAll > 0 ? (
        <PayChargesByCard
          personId={loan.borrower.id}
          loanId={loan.id}
          label={`Pay ${formatMoney(owedInAll, currency)} by card${loan.isMine ? '' : ' (at the bench)'}`}
        />
      ) : null}
      {staff && owedHere > 0 ? (
        <ActionButton
          url={`/api/people/${loan.borrower.id}/settle-charges`}
          body={{ amountMinor: owedHere }}
          label={`Record ${formatMoney(owedHere, currency)} paid in cash`}
          busyLabel="Recording…"
          done="Recorded."
        />
      ) : null}
      {staff && loan.deposit?.status === 'releasing' ? (
        <ActionButton
          url={`/api/loans/${loan.id}/deposit-release`}
          label="Send the deposit back again"
          busyLabel="Sending…"
          done="Sent back to the card."
        />
      ) : null}

      {loan.override ? (
        <section aria-label="Override" className="card border-red-300 dark:border-red-800">
          <p className="font-semibold">Lent although the check failed</p>
          <p>
            “{loan.override.reason}” — {loan.override.by ?? 'a steward'}
          </p>
        </section>
      ) : null}

      {loan.report ? (
        <>
          <p className="muted text-sm">
            The check as it ran when this was lent
            {loan.cautionAcknowledged ? '; the borrower confirmed reading the cautions' : ''}.
          </p>
          <CheckReport result={loan.report} verdict={loan.verdict} />
          <Cautions cautions={loan.report.cautions} />
        </>
      ) : null}

      <section aria-labelledby="lines-heading" className="card">
        <h2 id="lines-heading" className="text-lg font-bold">
          On this loan
        </h2>
        <ul className="mt-2 divide-y divide-stone-200 dark:divide-stone-800">
          {loan.lines.map((l) => (
            <li key={l.id} className="py-2">
              <span className="font-semibold">
                {l.qty > 1 ? `${l.qty} × ` : ''}
                {l.name}
              </span>
              <span className="muted block text-sm">
                {[
                  l.unitCode ? `label ${displayCode(l.unitCode)}` : null,
                  l.locationName ? `from ${l.locationName}` : null,
                  l.chainRole ? chainRoleWords(l.chainRole) : null,
                ]
                  .filter(Boolean)
                  .join(' · ')}
                {l.condition
                  ? ` · ${l.returnedQty} of ${l.qty} ${CONDITION.ok}${l.condition !== 'ok' ? `, rest ${CONDITION[l.condition]}` : ''}`
                  : ''}
              </span>
            </li>
          ))}
        </ul>
      </section>

      {(loan.status === 'out' && (staff || loan.isMine)) || (loan.status === 'back_unchecked' && staff) ? (
        <ReturnForm
          loanId={loan.id}
          lines={loan.lines.map((l) => ({ id: l.id, name: l.name, qty: l.qty, unitCode: l.unitCode }))}
          canCharge={staff}
          currency={currency}
        />
      ) : null}

      {staff && loan.reminders.length ? (
        <section aria-labelledby="rem-heading" className="card">
          <h2 id="rem-heading" className="text-lg font-bold">
            Reminders
          </h2>
          <ul className="mt-2 text-sm">
            {loan.reminders.map((r, i) => (
              <li key={i}>
                {r.kind.replace('_', ' ')} for {r.forDay}: {r.status}
                {r.sentAt ? ` ${formatDateTime(r.sentAt, tz)}` : ''}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
