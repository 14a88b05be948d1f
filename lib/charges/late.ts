import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { LoanSettings } from '@/lib/loans/settings';
import type { ChargeLine } from './write';
import { lateFeeMinor, openingDaysLate } from './late-fee';

// The late fee of a return being confirmed, where the space enables one (rules.lateFee): counted to when
// the loan came back — the member's own "it is back" under bench hand-over, else the confirmation — on the
// opening calendar (./late-fee.ts). Null when the space has no late fee, the loan was on time, or the loan
// already has its late fee (never two: also a unique index, migration 0016).

export async function lateFeeLine(
  trx: Db,
  spaceId: string,
  loanId: string,
  settings: LoanSettings,
  confirmedAt: Date,
): Promise<ChargeLine | null> {
  const rule = settings.rules.lateFee;
  if (!rule) return null;
  const loan = await scoped(trx, { spaceId })
    .selectFrom('loans')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select(['loans.due_at', 'loans.back_reported_at', 'kit_boxes.name as box'])
    .where('loans.id', '=', loanId)
    .executeTakeFirstOrThrow();
  if (!loan.due_at) return null;
  const days = openingDaysLate(loan.due_at, loan.back_reported_at ?? confirmedAt, {
    timeZone: settings.timeZone,
    closingTime: settings.closingTime,
    calendar: settings.calendar ?? { week: null, closedDates: [] },
  });
  if (days === 0) return null;
  const already = await scoped(trx, { spaceId })
    .selectFrom('charges')
    .select('id')
    .where('loan_id', '=', loanId)
    .where('kind', '=', 'late')
    .executeTakeFirst();
  if (already) return null;
  const amountMinor = lateFeeMinor(days, rule);
  return {
    lineId: null,
    kind: 'late',
    item: `${loan.box ?? 'Loan'}: back ${days} opening day${days === 1 ? '' : 's'} late`,
    amountMinor,
    note: amountMinor === rule.capMinor && days * rule.perOpeningDayMinor > rule.capMinor ? 'capped' : '',
  };
}
