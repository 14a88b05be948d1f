import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';

// Money paid towards a member's charges, in the caller's transaction: the open charges are locked
// (two payments at once cannot settle the same charge twice) and settled oldest first. Cash at the bench
// and a card payment reported by the processor both come through here.

export type Applied = { owedBeforeMinor: number; appliedMinor: number; charges: { chargeId: string; amountMinor: number }[] };

/** The member's open charges, locked, oldest first, with what is owed on each. */
export async function lockOpenCharges(trx: Db, spaceId: string, userId: string) {
  const open = await scoped(trx, { spaceId })
    .selectFrom('charges')
    .select(['id', 'amount_minor', 'from_deposit_minor', 'settled_minor'])
    .where('user_id', '=', userId)
    .where((eb) => eb('settled_minor', '<', eb('amount_minor', '-', eb.ref('from_deposit_minor'))))
    .orderBy('created_at')
    .orderBy('id')
    .forUpdate()
    .execute();
  return open.map((c) => ({ ...c, owedMinor: c.amount_minor - c.from_deposit_minor - c.settled_minor }));
}

/** Settles up to `amountMinor` of what the member owes; never more than is owed (the rest is the caller's). */
export async function applyToCharges(trx: Db, spaceId: string, userId: string, amountMinor: number): Promise<Applied> {
  const open = await lockOpenCharges(trx, spaceId, userId);
  const owedBeforeMinor = open.reduce((s, c) => s + c.owedMinor, 0);
  let left = Math.min(amountMinor, owedBeforeMinor);
  const charges: Applied['charges'] = [];
  for (const c of open) {
    if (left === 0) break;
    const part = Math.min(left, c.owedMinor);
    await scoped(trx, { spaceId })
      .updateTable('charges')
      .set({ settled_minor: c.settled_minor + part })
      .where('id', '=', c.id)
      .execute();
    charges.push({ chargeId: c.id, amountMinor: part });
    left -= part;
  }
  return { owedBeforeMinor, appliedMinor: charges.reduce((s, c) => s + c.amountMinor, 0), charges };
}
