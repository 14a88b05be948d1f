import 'server-only';
import { z } from 'zod';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { formatMoney } from '@/lib/money';
import { spaceClock } from '@/lib/sales/periods';
import { now } from '@/lib/clock';
import { applyToCharges, lockOpenCharges } from './apply';

// A steward records cash paid towards what a member owes: it settles their charges oldest first, in one
// transaction with its audit row (and a cash row in charge_payments), under a lock on those charges (two stewards recording at once cannot
// settle the same money twice). More than is owed is refused, naming the field.

export const settleSchema = z
  .object({
    amountMinor: z
      .number({ error: 'amountMinor must be a number' })
      .int({ error: 'amountMinor must be a whole number of minor units (ISO 4217)' })
      .min(1, { error: 'amountMinor must be at least 1' })
      .max(99_999_999, { error: 'amountMinor is at most 99999999' }),
  })
  .strict()
  .describe('amountMinor in the space currency (ISO 4217 minor units); refused when it is more than the person owes.');

export async function settleCharges(
  db: Db,
  ctx: Ctx,
  userId: string,
  input: z.infer<typeof settleSchema>,
): Promise<{ settledMinor: number; owedMinor: number; currency: string }> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward records what was paid.');
  return db.transaction().execute(async (trx) => {
    const member = await scoped(trx, ctx).selectFrom('memberships').select('user_id').where('user_id', '=', userId).executeTakeFirst();
    if (!member) throw new NotFoundError('No such person in this space.');
    const { currency } = await spaceClock(trx, ctx.spaceId);
    const owed = (await lockOpenCharges(trx, ctx.spaceId, userId)).reduce((s, c) => s + c.owedMinor, 0);
    if (input.amountMinor > owed)
      throw new InvalidError(`That is more than is owed (${formatMoney(owed, currency)}).`, {
        amountMinor: [`at most ${owed}`],
      });
    const { charges: applied } = await applyToCharges(trx, ctx.spaceId, userId, input.amountMinor);
    // Kept as a payment too, so the Books can show the month's cash paid towards charges.
    await scoped(trx, ctx)
      .insertInto('charge_payments')
      .values({
        space_id: ctx.spaceId,
        user_id: userId,
        method: 'cash',
        amount_minor: input.amountMinor,
        currency,
        status: 'paid',
        created_by: ctx.userId,
        paid_at: now(),
      })
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'charge.settled',
      targetType: 'user',
      targetId: userId,
      detail: { method: 'cash', amountMinor: input.amountMinor, currency, charges: applied },
    });
    return { settledMinor: input.amountMinor, owedMinor: owed - input.amountMinor, currency };
  });
}
