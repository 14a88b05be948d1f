import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Sale } from '@/db/types';
import { hasRole, isStaff, type Ctx } from '@/lib/auth/roles';
import { ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';

/** Who may see a sale: its buyer and whoever rang it up; stewards, admins and the treasurer see all. */
export function canSeeAllSales(ctx: Ctx): boolean {
  return isStaff(ctx) || hasRole(ctx, 'treasurer');
}

/** The sale in the caller's space that the caller may see; anything else is 404, never 403. */
export async function saleFor(db: Db, ctx: Ctx, saleId: string, lock = false): Promise<Sale> {
  let q = scoped(db, ctx).selectFrom('sales').selectAll().where('id', '=', saleId).where('space_id', '=', ctx.spaceId);
  if (!canSeeAllSales(ctx))
    q = q.where((eb) => eb.or([eb('buyer_id', '=', ctx.userId), eb('cashier_id', '=', ctx.userId)]));
  const sale = await (lock ? q.forUpdate() : q).executeTakeFirst();
  if (!sale) throw new NotFoundError('No such sale.');
  return sale;
}

/** The buyer of a new sale: the caller, or a member named by a steward selling on their behalf. */
export async function resolveBuyer(db: Db, ctx: Ctx, buyerId: string | undefined): Promise<string> {
  if (!buyerId || buyerId === ctx.userId) return ctx.userId;
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward can sell on someone else’s behalf.');
  const member = await scoped(db, ctx)
    .selectFrom('memberships')
    .select('user_id')
    .where('space_id', '=', ctx.spaceId)
    .where('user_id', '=', buyerId)
    .executeTakeFirst();
  if (!member) throw new InvalidError('Check buyerId.', { buyerId: ['Not a member of this space.'] });
  return buyerId;
}
