import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, NotFoundError } from '@/lib/errors';
import type { HoldInput } from './schemas';
import { loanSettings } from './settings';

// Holds: a member waits for a box or unit that is out. When it comes back the oldest waiting hold
// becomes 'ready', the item is 'held' for that person, and they get an e-mail (sent after commit).

export type HoldTarget = { kitBoxId: string } | { unitId: string };

const targetTable = (t: HoldTarget) => ('kitBoxId' in t ? 'kit_boxes' : 'units') as 'kit_boxes' | 'units';
const targetId = (t: HoldTarget) => ('kitBoxId' in t ? t.kitBoxId : t.unitId);
const holdColumn = (t: HoldTarget) =>
  ('kitBoxId' in t ? 'kit_box_id' : 'unit_id') as 'kit_box_id' | 'unit_id';

/**
 * An item is free again (a return, a refill, a cancelled ready hold): the next waiting hold, if any,
 * becomes ready and the item is kept for that person; otherwise it goes back on the shelf.
 * Returns the hold made ready, for the e-mail after commit.
 */
export async function releaseItem(trx: Db, spaceId: string, target: HoldTarget): Promise<string | null> {
  const next = await scoped(trx, { spaceId })
    .selectFrom('holds')
    .select('id')
    .where('space_id', '=', spaceId)
    .where(holdColumn(target), '=', targetId(target))
    .where('status', '=', 'waiting')
    .orderBy('created_at')
    .orderBy('id')
    .limit(1)
    .forUpdate()
    .executeTakeFirst();
  const table = targetTable(target);
  if (next) await scoped(trx, { spaceId }).updateTable('holds').set({ status: 'ready' }).where('id', '=', next.id).execute();
  if (table === 'kit_boxes')
    await scoped(trx, { spaceId })
      .updateTable('kit_boxes')
      .set({ state: next ? 'held' : 'on_shelf' })
      .where('id', '=', targetId(target))
      .execute();
  else
    await scoped(trx, { spaceId })
      .updateTable('units')
      .set({ state: next ? 'held' : 'on_shelf', updated_at: now() })
      .where('id', '=', targetId(target))
      .execute();
  return next?.id ?? null;
}

type Item = { id: string; name: string; state: string; inBox: string | null };

async function lockItem(trx: Db, spaceId: string, target: HoldTarget): Promise<Item> {
  const item =
    'kitBoxId' in target
      ? await scoped(trx, { spaceId })
          .selectFrom('kit_boxes')
          .select(['id', 'name', 'state'])
          .select((eb) => eb.val<string | null>(null).as('inBox'))
          .where('id', '=', target.kitBoxId)
          .where('space_id', '=', spaceId)
          .forUpdate()
          .executeTakeFirst()
      : await scoped(trx, { spaceId })
          .selectFrom('units')
          .innerJoin('parts', 'parts.id', 'units.part_id')
          .select(['units.id', 'parts.name', 'units.state', 'units.kit_box_id as inBox'])
          .where('units.id', '=', target.unitId)
          .where('units.space_id', '=', spaceId)
          .forUpdate('units')
          .executeTakeFirst();
  if (!item) throw new NotFoundError('No such box or unit.');
  return item as Item;
}

export async function placeHold(
  db: Db,
  ctx: Ctx,
  input: HoldInput,
): Promise<{ id: string; position: number }> {
  const target: HoldTarget = input.kitBoxId ? { kitBoxId: input.kitBoxId } : { unitId: input.unitId! };
  const field = 'kitBoxId' in target ? 'kitBoxId' : 'unitId';
  const settings = await loanSettings(db, ctx.spaceId);
  return db.transaction().execute(async (trx) => {
    const item = await lockItem(trx, ctx.spaceId, target);
    if (item.inBox)
      throw new ConflictError(`${item.name} is part of a kit box; hold the box.`, {
        [field]: ['part of a kit box'],
      });
    if (item.state === 'on_shelf')
      throw new ConflictError(`${item.name} is on the shelf: borrow it now.`, { [field]: ['on the shelf'] });
    if (item.state === 'retired')
      throw new ConflictError(`${item.name} is retired.`, { [field]: ['retired'] });
    const mine = await scoped(trx, ctx)
      .selectFrom('loans')
      .leftJoin('loan_lines', 'loan_lines.loan_id', 'loans.id')
      .select('loans.id')
      .where('loans.borrower_id', '=', ctx.userId)
      .where('loans.status', '=', 'out')
      .where((eb) =>
        'kitBoxId' in target
          ? eb('loans.kit_box_id', '=', target.kitBoxId)
          : eb('loan_lines.unit_id', '=', target.unitId),
      )
      .executeTakeFirst();
    if (mine)
      throw new ConflictError('You have it out yourself; renew the loan instead.', {
        [field]: ['already yours'],
      });
    const open = await scoped(trx, ctx)
      .selectFrom('holds')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .where('user_id', '=', ctx.userId)
      .where('status', 'in', ['waiting', 'ready'])
      .executeTakeFirstOrThrow();
    const already = await scoped(trx, ctx)
      .selectFrom('holds')
      .select('id')
      .where('user_id', '=', ctx.userId)
      .where(holdColumn(target), '=', item.id)
      .where('status', 'in', ['waiting', 'ready'])
      .executeTakeFirst();
    if (already) throw new ConflictError('You already hold it.', { [field]: ['already held by you'] });
    if (open.n >= settings.maxOpenHolds)
      throw new ConflictError(`You can hold ${settings.maxOpenHolds} things at once.`, {
        [field]: ['hold limit reached'],
      });
    const hold = await scoped(trx, ctx)
      .insertInto('holds')
      .values({
        space_id: ctx.spaceId,
        user_id: ctx.userId,
        [holdColumn(target)]: item.id,
        created_at: now(),
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const ahead = await scoped(trx, ctx)
      .selectFrom('holds')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where(holdColumn(target), '=', item.id)
      .where('status', 'in', ['waiting', 'ready'])
      .where('id', '<>', hold.id)
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'hold.placed',
      targetType: 'hold',
      targetId: hold.id,
      detail: { item: item.name, [field]: item.id },
    });
    return { id: hold.id, position: ahead.n + 1 };
  });
}

/** The holder or a steward cancels; a ready hold frees the item for the next in line. */
export async function cancelHold(db: Db, ctx: Ctx, holdId: string): Promise<{ readyHoldId: string | null }> {
  return db.transaction().execute(async (trx) => {
    const hold = await scoped(trx, ctx)
      .selectFrom('holds')
      .select(['id', 'user_id', 'status', 'kit_box_id', 'unit_id'])
      .where('id', '=', holdId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!hold || (hold.user_id !== ctx.userId && !isStaff(ctx))) throw new NotFoundError('No such hold.');
    if (hold.status !== 'waiting' && hold.status !== 'ready')
      throw new ConflictError(`The hold is already ${hold.status}.`, { holdId: [hold.status] });
    await scoped(trx, ctx).updateTable('holds').set({ status: 'cancelled' }).where('id', '=', hold.id).execute();
    let readyHoldId: string | null = null;
    if (hold.status === 'ready') {
      const target: HoldTarget = hold.kit_box_id ? { kitBoxId: hold.kit_box_id } : { unitId: hold.unit_id! };
      await lockItem(trx, ctx.spaceId, target);
      readyHoldId = await releaseItem(trx, ctx.spaceId, target);
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'hold.cancelled',
      targetType: 'hold',
      targetId: hold.id,
      detail: { wasReady: hold.status === 'ready', forUser: hold.user_id },
    });
    return { readyHoldId };
  });
}
