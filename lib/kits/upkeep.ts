import 'server-only';
import { scoped } from '@/db/scoped';
import type { Db } from '@/db/connect';
import type { UnitState } from '@/db/types';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { inTransaction } from '@/lib/inventory/tx';
import { boxShortfall } from './boxes';
import { countedOut, DESTINATION_WORDS, unitOut, type BoxRef } from './contents';
import type { TakeApartInput, TakeOutInput } from './schemas';

// A steward's upkeep of a kit box, each one transaction with its audit row: take a unit or some of a
// counted part out (to the shelf, to repair, retired / written off), swap a unit for another of the
// same part, or take the whole box apart. A box left short against its template goes out of service
// (in repair) until it is refilled, so it shows on Today and Repairs.

type LockedBox = BoxRef & { state: UnitState; templateId: string };

async function lockBox(trx: Db, ctx: Ctx, boxId: string): Promise<LockedBox> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  const box = await scoped(trx, ctx)
    .selectFrom('kit_boxes')
    .select(['id', 'name', 'state', 'template_id as templateId', 'location_id as locationId'])
    .where('id', '=', boxId)
    .where('space_id', '=', ctx.spaceId)
    .forUpdate()
    .executeTakeFirst();
  if (!box) throw new NotFoundError('No such kit box.');
  if (box.state === 'out')
    throw new ConflictError('The box is out on loan; change it when it is back.', {
      kitBoxId: ['out on loan'],
    });
  if (box.state === 'retired')
    throw new ConflictError('The box is taken apart already.', { kitBoxId: ['retired'] });
  return box;
}

async function outOfServiceIfShort(trx: Db, ctx: Ctx, box: LockedBox): Promise<boolean> {
  if (box.state !== 'on_shelf') return box.state === 'in_repair';
  if (!(await boxShortfall(trx, ctx.spaceId, box.id, box.templateId)).length) return false;
  await scoped(trx, ctx).updateTable('kit_boxes').set({ state: 'in_repair' }).where('id', '=', box.id).execute();
  return true;
}

export type TakeOutResult = {
  removed: string;
  replacement: string | null;
  boxState: 'in_repair' | UnitState;
};

export async function takeOutOfBox(
  db: Db,
  ctx: Ctx,
  boxId: string,
  input: TakeOutInput,
): Promise<TakeOutResult> {
  return inTransaction(db, async (trx) => {
    const box = await lockBox(trx, ctx, boxId);
    const at = now();
    let removed: string;
    let replacement: string | null = null;
    if (input.unitId) {
      const unit = await scoped(trx, ctx)
        .selectFrom('kit_box_contents as c')
        .innerJoin('units', 'units.id', 'c.unit_id')
        .innerJoin('parts', 'parts.id', 'units.part_id')
        .select([
          'units.id',
          'units.code',
          'units.part_id as partId',
          'parts.name',
          'c.chain_role as chainRole',
        ])
        .where('c.kit_box_id', '=', box.id)
        .where('c.unit_id', '=', input.unitId)
        .executeTakeFirst();
      if (!unit) throw new InvalidError('That unit is not in this box.', { unitId: ['not in this box'] });
      if (input.replacementUnitId) {
        const next = await scoped(trx, ctx)
          .selectFrom('units')
          .select(['id', 'code', 'part_id', 'state', 'kit_box_id'])
          .where('id', '=', input.replacementUnitId)
          .where('space_id', '=', ctx.spaceId)
          .forUpdate()
          .executeTakeFirst();
        if (!next)
          throw new InvalidError('No such unit in this space.', { replacementUnitId: ['no such unit'] });
        if (next.part_id !== unit.partId)
          throw new InvalidError(`Swap in another ${unit.name}.`, {
            replacementUnitId: [`must be a ${unit.name}`],
          });
        if (next.state !== 'on_shelf' || next.kit_box_id)
          throw new ConflictError(`Unit ${next.code} is not free on the shelf.`, {
            replacementUnitId: [`${next.code} is not free`],
          });
        await unitOut(trx, ctx, box, unit, input.to, {
          at,
          locationId: input.locationId,
          reason: input.reason,
        });
        await scoped(trx, ctx)
          .updateTable('units')
          .set({ kit_box_id: box.id, location_id: null, updated_at: at })
          .where('id', '=', next.id)
          .execute();
        await scoped(trx, ctx)
          .insertInto('kit_box_contents')
          .values({
            space_id: ctx.spaceId,
            kit_box_id: box.id,
            part_id: next.part_id,
            unit_id: next.id,
            qty: 1,
            chain_role: unit.chainRole,
          })
          .execute();
        await scoped(trx, ctx)
          .insertInto('stock_movements')
          .values({
            space_id: ctx.spaceId,
            part_id: next.part_id,
            unit_id: next.id,
            qty_delta: 0,
            reason: 'kit_build',
            ref_type: 'kit_box',
            ref_id: box.id,
            note: `into ${box.name} in place of ${unit.code}`,
            actor_id: ctx.userId,
            created_at: at,
          })
          .execute();
        replacement = `${unit.name} (${next.code})`;
      } else
        await unitOut(trx, ctx, box, unit, input.to, {
          at,
          locationId: input.locationId,
          reason: input.reason,
        });
      removed = `${unit.name} (${unit.code})`;
    } else {
      const part = await scoped(trx, ctx)
        .selectFrom('parts')
        .select(['id', 'name'])
        .where('id', '=', input.partId!)
        .where('space_id', '=', ctx.spaceId)
        .executeTakeFirst();
      if (!part) throw new InvalidError('No such part in this space.', { partId: ['no such part'] });
      await countedOut(trx, ctx, box, part, input.qty, input.to, {
        at,
        locationId: input.locationId,
        reason: input.reason,
      });
      removed = `${input.qty} × ${part.name}`;
    }
    const short = await outOfServiceIfShort(trx, ctx, box);
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: replacement ? 'kit_box.unit_swapped' : 'kit_box.taken_out',
      targetType: 'kit_box',
      targetId: box.id,
      detail: {
        name: box.name,
        removed,
        to: DESTINATION_WORDS[input.to],
        ...(replacement ? { replacement } : {}),
        ...(input.reason ? { reason: input.reason } : {}),
      },
    });
    return { removed, replacement, boxState: short ? 'in_repair' : box.state };
  });
}

/** Everything back on the shelf (units to their place, counted parts into a bin); the box is retired and its holds end. */
export async function takeBoxApart(
  db: Db,
  ctx: Ctx,
  boxId: string,
  input: TakeApartInput,
): Promise<{ returned: string[] }> {
  return inTransaction(db, async (trx) => {
    const box = await lockBox(trx, ctx, boxId);
    const at = now();
    const contents = await scoped(trx, ctx)
      .selectFrom('kit_box_contents as c')
      .innerJoin('parts', 'parts.id', 'c.part_id')
      .leftJoin('units', 'units.id', 'c.unit_id')
      .select(['c.part_id as partId', 'c.unit_id as unitId', 'c.qty', 'parts.name', 'units.code'])
      .where('c.kit_box_id', '=', box.id)
      .orderBy('parts.name')
      .execute();
    const returned: string[] = [];
    for (const c of contents) {
      const opts = { at, locationId: input.locationId, reason: input.reason || 'box taken apart' };
      if (c.unitId) {
        await unitOut(trx, ctx, box, { id: c.unitId, partId: c.partId, code: c.code ?? '' }, 'shelf', opts);
        returned.push(`${c.name} (${c.code})`);
      } else {
        await countedOut(trx, ctx, box, { id: c.partId, name: c.name }, c.qty, 'shelf', opts);
        returned.push(`${c.qty} × ${c.name}`);
      }
    }
    await scoped(trx, ctx).updateTable('kit_boxes').set({ state: 'retired' }).where('id', '=', box.id).execute();
    await scoped(trx, ctx)
      .updateTable('holds')
      .set({ status: 'cancelled' })
      .where('kit_box_id', '=', box.id)
      .where('status', 'in', ['waiting', 'ready'])
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'kit_box.taken_apart',
      targetType: 'kit_box',
      targetId: box.id,
      detail: { name: box.name, returned, ...(input.reason ? { reason: input.reason } : {}) },
    });
    return { returned };
  });
}

export type OutOfServiceBox = {
  id: string;
  name: string;
  code: string;
  shortfall: { partId: string; name: string; missing: number }[];
  /** The latest short return: what was missing or damaged, and the steward's note. */
  lastReturn: { at: Date; note: string; lines: { part: string; qty: number; condition: string }[] } | null;
};

/** Boxes out of service (waiting in repair), each with what it lacks and why. */
export async function boxesOutOfService(db: Db, ctx: Pick<Ctx, 'spaceId'>): Promise<OutOfServiceBox[]> {
  const boxes = await scoped(db, ctx)
    .selectFrom('kit_boxes')
    .select(['id', 'name', 'code', 'template_id'])
    .where('space_id', '=', ctx.spaceId)
    .where('state', '=', 'in_repair')
    .orderBy('name')
    .execute();
  return Promise.all(
    boxes.map(async (b) => {
      const loan = await scoped(db, ctx)
        .selectFrom('loans')
        .select(['id', 'returned_at', 'return_note'])
        .where('space_id', '=', ctx.spaceId)
        .where('kit_box_id', '=', b.id)
        .where('status', '=', 'returned_short')
        .orderBy('returned_at', 'desc')
        .limit(1)
        .executeTakeFirst();
      const lines = loan
        ? await scoped(db, ctx)
            .selectFrom('loan_lines')
            .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
            .select([
              'parts.name as part',
              'loan_lines.qty',
              'loan_lines.returned_qty',
              'loan_lines.return_condition',
            ])
            .where('loan_lines.loan_id', '=', loan.id)
            .where('loan_lines.return_condition', 'in', ['missing', 'damaged'])
            .orderBy('parts.name')
            .execute()
        : [];
      return {
        id: b.id,
        name: b.name,
        code: b.code,
        shortfall: await boxShortfall(db, ctx.spaceId, b.id, b.template_id),
        lastReturn: loan
          ? {
              at: loan.returned_at ?? new Date(0),
              note: loan.return_note,
              lines: lines.map((l) => ({
                part: l.part,
                qty: l.qty - l.returned_qty,
                condition: l.return_condition ?? '',
              })),
            }
          : null,
      };
    }),
  );
}

export type UpkeepChoices = {
  bins: { id: string; name: string }[];
  /** Free units on the shelf, by part, that could be swapped into the box. */
  spares: Record<string, { id: string; code: string }[]>;
};

/** What the upkeep screen offers: bins for parts going back, and spare units for swaps. */
export async function upkeepChoices(db: Db, ctx: Ctx, boxId: string): Promise<UpkeepChoices> {
  const bins = await scoped(db, ctx)
    .selectFrom('locations')
    .select(['id', 'name'])
    .where('space_id', '=', ctx.spaceId)
    .orderBy('name')
    .execute();
  const free = await scoped(db, ctx)
    .selectFrom('units')
    .select(['units.id', 'units.code', 'units.part_id'])
    .where('units.space_id', '=', ctx.spaceId)
    .where('units.state', '=', 'on_shelf')
    .where('units.kit_box_id', 'is', null)
    .where('units.part_id', 'in', (eb) =>
      eb
        .selectFrom('kit_box_contents')
        .select('part_id')
        .where('kit_box_id', '=', boxId)
        .where('unit_id', 'is not', null),
    )
    .orderBy('units.code')
    .execute();
  const spares: UpkeepChoices['spares'] = {};
  for (const u of free) (spares[u.part_id] ??= []).push({ id: u.id, code: u.code });
  return { bins, spares };
}
