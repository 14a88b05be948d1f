import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { fixRelease, type FixedRelease } from '@/lib/deposits/release';
import { spaceClock } from '@/lib/sales/periods';

// Charges for what did not come back in good order, written in the return's own transaction: each
// names its item, kind and the steward's note. They are paid from the loan's held deposit first (in the
// order of the loan's lines); whatever the deposit does not cover is owed (lib/charges/owed.ts). The part
// itself is written off by the return through the stock and unit services (never a counter sale), so the
// count stays right.

export type ChargeLine = {
  /** The loan line charged for; null for a late fee, which is the whole loan's. */
  lineId: string | null;
  item: string;
  kind: 'missing' | 'damaged' | 'late';
  amountMinor: number;
  note: string;
};

export type Charged = {
  charges: { id: string; item: string; amountMinor: number; fromDepositMinor: number; owedMinor: number }[];
  currency: string;
  release: FixedRelease | null;
};

export async function chargeAndRelease(
  trx: Db,
  spaceId: string,
  loan: { id: string; borrower_id: string },
  lines: ChargeLine[],
  actorId: string,
): Promise<Charged> {
  const { currency } = await spaceClock(trx, spaceId);
  const total = lines.reduce((sum, l) => sum + l.amountMinor, 0);
  const release = await fixRelease(trx, spaceId, loan.id, total, actorId);
  let fromDeposit = release?.keptMinor ?? 0;
  const at = now();
  const charges: Charged['charges'] = [];
  for (const l of lines) {
    const taken = Math.min(fromDeposit, l.amountMinor);
    fromDeposit -= taken;
    const row = await scoped(trx, { spaceId })
      .insertInto('charges')
      .values({
        space_id: spaceId,
        user_id: loan.borrower_id,
        loan_id: loan.id,
        loan_line_id: l.lineId,
        kind: l.kind,
        item: l.item.slice(0, 300),
        note: l.note,
        amount_minor: l.amountMinor,
        currency,
        from_deposit_minor: taken,
        created_by: actorId,
        created_at: at,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    charges.push({ id: row.id, item: l.item, amountMinor: l.amountMinor, fromDepositMinor: taken, owedMinor: l.amountMinor - taken });
    await audit(trx, {
      spaceId,
      actorId,
      action: 'charge.created',
      targetType: 'loan',
      targetId: loan.id,
      detail: {
        chargeId: row.id,
        userId: loan.borrower_id,
        item: l.item,
        kind: l.kind,
        amountMinor: l.amountMinor,
        fromDepositMinor: taken,
        currency,
        ...(l.note ? { note: l.note } : {}),
      },
    });
  }
  return { charges, currency, release };
}
