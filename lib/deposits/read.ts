import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { DepositStatus } from '@/db/types';

// A loan's money, as its page shows it: the deposit (and its pay page while unpaid) and the charges.

export type LoanMoney = {
  deposit: {
    status: DepositStatus;
    amountMinor: number;
    currency: string;
    keptMinor: number;
    releasedMinor: number | null;
    payUrl: string | null;
  } | null;
  charges: { id: string; item: string; kind: 'missing' | 'damaged' | 'late'; note: string; amountMinor: number; fromDepositMinor: number; settledMinor: number; currency: string }[];
};

export async function loanMoney(db: Db, spaceId: string, loanId: string): Promise<LoanMoney> {
  const d = await scoped(db, { spaceId })
    .selectFrom('deposits')
    .select(['status', 'amount_minor', 'currency', 'kept_minor', 'released_minor', 'checkout_url'])
    .where('loan_id', '=', loanId)
    .executeTakeFirst();
  const charges = await scoped(db, { spaceId })
    .selectFrom('charges')
    .select(['id', 'item', 'kind', 'note', 'amount_minor', 'from_deposit_minor', 'settled_minor', 'currency'])
    .where('loan_id', '=', loanId)
    .orderBy('created_at')
    .orderBy('id')
    .execute();
  return {
    deposit: d
      ? {
          status: d.status,
          amountMinor: d.amount_minor,
          currency: d.currency,
          keptMinor: d.kept_minor,
          releasedMinor: d.released_minor,
          payUrl: d.status === 'pending' ? d.checkout_url : null,
        }
      : null,
    charges: charges.map((c) => ({
      id: c.id,
      item: c.item,
      kind: c.kind,
      note: c.note,
      amountMinor: c.amount_minor,
      fromDepositMinor: c.from_deposit_minor,
      settledMinor: c.settled_minor,
      currency: c.currency,
    })),
  };
}
