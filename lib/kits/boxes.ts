import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { ChainRole, UnitState } from '@/db/types';
import { newCode } from '@/labels/code';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { releaseItem } from '@/lib/loans/holds';
import { boxesOfSpace } from '@/lib/loans/selection';
import { removeSurplus } from './contents';
import type { BuildBoxInput } from './schemas';

// Kit boxes: physical boxes with a label, built from a template out of labelled units and counted
// stock. Building and refilling take the parts off the shelf in one transaction ('kit_build'
// movements); a box that came back short sits in repair until it is refilled. A refill first takes out
// what the template no longer lists (lib/kits/contents.ts), so it replaces a changed part.

export type BoxSummary = {
  id: string;
  name: string;
  code: string;
  state: UnitState;
  templateId: string;
  templateName: string;
  dueAt: Date | null;
  locationName: string | null;
};

export async function listBoxes(db: Db, ctx: Ctx, opts: { templateId?: string } = {}): Promise<BoxSummary[]> {
  let q = boxesOfSpace(db, ctx.spaceId).select(
    sql<Date | null>`(select l.due_at from loans l where l.space_id = kit_boxes.space_id and l.kit_box_id = kit_boxes.id and l.status = 'out' limit 1)`.as(
      'dueAt',
    ),
  );
  if (opts.templateId) q = q.where('kit_boxes.template_id', '=', opts.templateId);
  return q.orderBy('kit_templates.name').orderBy('kit_boxes.name').execute();
}

/** Lines of the template the box lacks (after a short return, or a template edited since). */
export async function boxShortfall(
  db: Db,
  spaceId: string,
  kitBoxId: string,
  templateId: string,
): Promise<{ partId: string; name: string; missing: number }[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('kit_template_lines as l')
    .innerJoin('parts', 'parts.id', 'l.part_id')
    .select([
      'l.part_id as partId',
      'parts.name',
      sql<number>`(l.qty - coalesce((select sum(c.qty) from kit_box_contents c where c.space_id = l.space_id and c.kit_box_id = ${kitBoxId} and c.part_id = l.part_id), 0))::int`.as(
        'missing',
      ),
    ])
    .where('l.template_id', '=', templateId)
    .orderBy('l.position')
    .execute();
  return rows.filter((r) => r.missing > 0);
}

type Picks = { unitIds: string[]; fromLocations: { partId: string; locationId: string }[] };

/** Takes from the shelf what the box lacks against its template. Returns what was added. */
async function fillBox(
  trx: Db,
  ctx: Ctx,
  box: { id: string; templateId: string },
  picks: Picks,
): Promise<string[]> {
  const at = now();
  const lines = await scoped(trx, ctx)
    .selectFrom('kit_template_lines as l')
    .innerJoin('parts', 'parts.id', 'l.part_id')
    .select(['l.part_id as partId', 'l.qty', 'l.chain_role as chainRole', 'parts.name', 'parts.tracking'])
    .where('l.template_id', '=', box.templateId)
    .orderBy('l.position')
    .execute();
  const unused = new Set(picks.unitIds);
  const added: string[] = [];
  for (const line of lines) {
    const have = await scoped(trx, ctx)
      .selectFrom('kit_box_contents')
      .select(sql<number>`coalesce(sum(qty), 0)::int`.as('n'))
      .where('kit_box_id', '=', box.id)
      .where('part_id', '=', line.partId)
      .executeTakeFirstOrThrow();
    const need = line.qty - have.n;
    if (need <= 0) continue;
    if (line.tracking === 'unit') await takeUnits(trx, ctx, box.id, line, need, unused, at);
    else
      await takeCounted(
        trx,
        ctx,
        box.id,
        line,
        need,
        picks.fromLocations.find((f) => f.partId === line.partId)?.locationId,
        at,
      );
    added.push(`${need} × ${line.name}`);
  }
  if (unused.size)
    throw new InvalidError('Some chosen units are not needed by this kit.', {
      unitIds: [`${unused.size} unit(s) not on the kit's list or not needed`],
    });
  return added;
}

type Line = { partId: string; name: string; chainRole: ChainRole | null };

async function takeUnits(
  trx: Db,
  ctx: Ctx,
  boxId: string,
  line: Line,
  need: number,
  chosen: Set<string>,
  at: Date,
) {
  const ofPart = () =>
    scoped(trx, ctx)
      .selectFrom('units')
      .select(['id', 'code', 'state', 'kit_box_id'])
      .where('space_id', '=', ctx.spaceId)
      .where('part_id', '=', line.partId);
  // The steward's own picks first (locked in id order), then the first free units by label.
  const picked = chosen.size
    ? await ofPart()
        .where('id', 'in', [...chosen])
        .orderBy('id')
        .forUpdate()
        .execute()
    : [];
  for (const u of picked)
    if (u.state !== 'on_shelf' || u.kit_box_id)
      throw new ConflictError(`Unit ${u.code} is not free on the shelf.`, {
        unitIds: [`${u.code} is not free`],
      });
  let units = picked.slice(0, need).map((u) => u.id);
  units.forEach((id) => chosen.delete(id));
  if (units.length < need) {
    let more = ofPart().where('state', '=', 'on_shelf').where('kit_box_id', 'is', null);
    if (units.length) more = more.where('id', 'not in', units);
    const extra = await more
      .orderBy('code')
      .limit(need - units.length)
      .forUpdate()
      .skipLocked()
      .execute();
    units = units.concat(extra.map((u) => u.id));
  }
  if (units.length < need)
    throw new ConflictError(`Not enough free units of ${line.name} (need ${need}).`, {
      unitIds: [`short of ${line.name}`],
    });
  await scoped(trx, ctx)
    .updateTable('units')
    .set({ kit_box_id: boxId, location_id: null, updated_at: at })
    .where('id', 'in', units)
    .execute();
  await scoped(trx, ctx)
    .insertInto('kit_box_contents')
    .values(
      units.map((u) => ({
        space_id: ctx.spaceId,
        kit_box_id: boxId,
        part_id: line.partId,
        unit_id: u,
        qty: 1,
        chain_role: line.chainRole,
      })),
    )
    .execute();
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values(
      units.map((u) => ({
        space_id: ctx.spaceId,
        part_id: line.partId,
        unit_id: u,
        qty_delta: 0,
        reason: 'kit_build' as const,
        ref_type: 'kit_box',
        ref_id: boxId,
        actor_id: ctx.userId,
        created_at: at,
      })),
    )
    .execute();
}

async function takeCounted(
  trx: Db,
  ctx: Ctx,
  boxId: string,
  line: Line,
  need: number,
  locationId: string | undefined,
  at: Date,
) {
  const from =
    locationId ??
    (
      await scoped(trx, ctx)
        .selectFrom('stock')
        .select('location_id')
        .where('space_id', '=', ctx.spaceId)
        .where('part_id', '=', line.partId)
        .where('qty', '>=', need)
        .orderBy('qty', 'desc')
        .limit(1)
        .executeTakeFirst()
    )?.location_id;
  if (!from)
    throw new ConflictError(`No bin holds ${need} of ${line.name}.`, {
      fromLocations: [`short of ${line.name}`],
    });
  const left = await scoped(trx, ctx)
    .updateTable('stock')
    .set((eb) => ({ qty: eb('qty', '-', need), updated_at: at }))
    .where('space_id', '=', ctx.spaceId)
    .where('part_id', '=', line.partId)
    .where('location_id', '=', from)
    .where('qty', '>=', need)
    .returning('qty')
    .executeTakeFirst();
  if (!left)
    throw new ConflictError(`That bin does not hold ${need} of ${line.name}.`, {
      fromLocations: [`short of ${line.name}`],
    });
  const existing = await scoped(trx, ctx)
    .selectFrom('kit_box_contents')
    .select('id')
    .where('kit_box_id', '=', boxId)
    .where('part_id', '=', line.partId)
    .where('unit_id', 'is', null)
    .executeTakeFirst();
  if (existing)
    await scoped(trx, ctx)
      .updateTable('kit_box_contents')
      .set((eb) => ({ qty: eb('qty', '+', need) }))
      .where('id', '=', existing.id)
      .execute();
  else
    await scoped(trx, ctx)
      .insertInto('kit_box_contents')
      .values({ space_id: ctx.spaceId, kit_box_id: boxId, part_id: line.partId, qty: need, chain_role: line.chainRole })
      .execute();
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values({
      space_id: ctx.spaceId,
      part_id: line.partId,
      location_id: from,
      qty_delta: -need,
      reason: 'kit_build',
      ref_type: 'kit_box',
      ref_id: boxId,
      actor_id: ctx.userId,
      created_at: at,
    })
    .execute();
}

async function newBoxCode(trx: Db, spaceId: string, boxId: string): Promise<string> {
  for (;;) {
    const code = newCode();
    const row = await scoped(trx, { spaceId })
      .insertInto('label_codes')
      .values({ code, space_id: spaceId, kind: 'kit_box', target_id: boxId })
      .onConflict((oc) => oc.column('code').doNothing())
      .returning('code')
      .executeTakeFirst();
    if (row) return row.code;
  }
}

export async function buildBox(
  db: Db,
  ctx: Ctx,
  input: BuildBoxInput,
): Promise<{ id: string; code: string; added: string[] }> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  return db.transaction().execute(async (trx) => {
    const t = await scoped(trx, ctx)
      .selectFrom('kit_templates')
      .select(['id', 'name'])
      .where('id', '=', input.templateId)
      .where('space_id', '=', ctx.spaceId)
      .executeTakeFirst();
    if (!t) throw new NotFoundError('No such kit.');
    if (input.locationId) {
      const loc = await scoped(trx, ctx)
        .selectFrom('locations')
        .select('id')
        .where('id', '=', input.locationId)
        .where('space_id', '=', ctx.spaceId)
        .executeTakeFirst();
      if (!loc) throw new InvalidError('No such shelf in this space.', { locationId: ['no such location'] });
    }
    const count = await scoped(trx, ctx)
      .selectFrom('kit_boxes')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('template_id', '=', t.id)
      .executeTakeFirstOrThrow();
    const id = crypto.randomUUID();
    const code = await newBoxCode(trx, ctx.spaceId, id);
    const name = input.name ?? `${t.name.split(',')[0]} box ${count.n + 1}`;
    await scoped(trx, ctx)
      .insertInto('kit_boxes')
      .values({
        id,
        space_id: ctx.spaceId,
        template_id: t.id,
        code,
        name,
        location_id: input.locationId ?? null,
        created_at: now(),
      })
      .execute();
    const added = await fillBox(trx, ctx, { id, templateId: t.id }, input);
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'kit_box.built',
      targetType: 'kit_box',
      targetId: id,
      detail: { name, template: t.name, added },
    });
    return { id, code, added };
  });
}

/** Refills a box from the shelf; a box that was waiting in repair goes back on the shelf (or to a hold). */
export async function refillBox(
  db: Db,
  ctx: Ctx,
  kitBoxId: string,
  picks: Picks,
): Promise<{ added: string[]; removed: string[]; readyHoldId: string | null }> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  return db.transaction().execute(async (trx) => {
    const box = await scoped(trx, ctx)
      .selectFrom('kit_boxes')
      .select(['id', 'name', 'state', 'template_id as templateId', 'location_id as locationId'])
      .where('id', '=', kitBoxId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!box) throw new NotFoundError('No such kit box.');
    if (box.state === 'out' || box.state === 'retired')
      throw new ConflictError(`The box is ${box.state}; refill it when it is back.`, {
        kitBoxId: [box.state],
      });
    // What the template no longer wants comes out first, so a changed line is replaced, not doubled.
    const removed = await removeSurplus(trx, ctx, box, now());
    const added = await fillBox(trx, ctx, box, picks);
    let readyHoldId: string | null = null;
    if (box.state === 'in_repair') readyHoldId = await releaseItem(trx, ctx.spaceId, { kitBoxId: box.id });
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'kit_box.refilled',
      targetType: 'kit_box',
      targetId: box.id,
      detail: { name: box.name, added, ...(removed.length ? { removed } : {}) },
    });
    return { added, removed, readyHoldId };
  });
}

/** Places a box can be kept (for the build form). */
export async function boxLocations(db: Db, ctx: Ctx): Promise<{ id: string; name: string }[]> {
  return scoped(db, ctx)
    .selectFrom('locations')
    .select(['id', 'name'])
    .where('space_id', '=', ctx.spaceId)
    .orderBy('name')
    .execute();
}
