import 'server-only';
import { scoped } from '@/db/scoped';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { InvalidError } from '@/lib/errors';
import { releaseItem } from '@/lib/loans/holds';

// Moving things out of a kit box, inside the caller's transaction: a labelled unit back on the shelf,
// to repair or retired; a counted quantity back into a bin or written off. Each leaves a movement
// that names the box. Used by the upkeep screens and by refill (which takes out what the template no
// longer wants before it adds what it lacks).

export type Destination = 'shelf' | 'repair' | 'retired';
export type BoxRef = { id: string; name: string; locationId: string | null };

const UNIT_STATE = { shelf: 'on_shelf', repair: 'in_repair', retired: 'retired' } as const;
export const DESTINATION_WORDS: Record<Destination, string> = {
  shelf: 'back on the shelf',
  repair: 'to repair',
  retired: 'retired',
};

/** Takes one unit out of the box; returns its code. */
export async function unitOut(
  trx: Db,
  ctx: Ctx,
  box: BoxRef,
  unit: { id: string; partId: string; code: string },
  to: Destination,
  opts: { locationId?: string | null; reason?: string; at: Date },
): Promise<void> {
  const locationId = opts.locationId ?? box.locationId;
  await scoped(trx, ctx)
    .deleteFrom('kit_box_contents')
    .where('kit_box_id', '=', box.id)
    .where('unit_id', '=', unit.id)
    .execute();
  await scoped(trx, ctx)
    .updateTable('units')
    .set({
      kit_box_id: null,
      state: UNIT_STATE[to],
      location_id: locationId,
      updated_at: opts.at,
      ...(to === 'shelf' ? {} : { notes: opts.reason || `taken out of ${box.name}` }),
    })
    .where('id', '=', unit.id)
    .where('space_id', '=', ctx.spaceId)
    .execute();
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values({
      space_id: ctx.spaceId,
      part_id: unit.partId,
      location_id: locationId,
      unit_id: unit.id,
      qty_delta: to === 'retired' ? -1 : 0,
      reason: to === 'retired' ? 'retire' : to === 'repair' ? 'repair' : 'move_in',
      ref_type: 'kit_box',
      ref_id: box.id,
      note: [`out of ${box.name}, ${DESTINATION_WORDS[to]}`, opts.reason].filter(Boolean).join(': '),
      actor_id: ctx.userId,
      created_at: opts.at,
    })
    .execute();
  // Someone may be waiting for this very unit.
  if (to === 'shelf') await releaseItem(trx, ctx.spaceId, { unitId: unit.id });
}

/** The bin a counted part goes back to: the one given, else the bin holding most of it, else the box's own place. */
async function binFor(
  trx: Db,
  ctx: Ctx,
  box: BoxRef,
  partId: string,
  given?: string | null,
): Promise<string | null> {
  if (given) {
    const loc = await scoped(trx, ctx)
      .selectFrom('locations')
      .select('id')
      .where('id', '=', given)
      .where('space_id', '=', ctx.spaceId)
      .executeTakeFirst();
    if (!loc) throw new InvalidError('No such bin in this space.', { locationId: ['no such location'] });
    return loc.id;
  }
  const most = await scoped(trx, ctx)
    .selectFrom('stock')
    .select('location_id')
    .where('space_id', '=', ctx.spaceId)
    .where('part_id', '=', partId)
    .orderBy('qty', 'desc')
    .limit(1)
    .executeTakeFirst();
  return most?.location_id ?? box.locationId;
}

/** Takes `qty` of a counted part out of the box: into a bin, or written off as damaged ('repair') or lost. */
export async function countedOut(
  trx: Db,
  ctx: Ctx,
  box: BoxRef,
  part: { id: string; name: string },
  qty: number,
  to: Destination,
  opts: { locationId?: string | null; reason?: string; at: Date },
): Promise<void> {
  const content = await scoped(trx, ctx)
    .selectFrom('kit_box_contents')
    .select(['id', 'qty'])
    .where('kit_box_id', '=', box.id)
    .where('part_id', '=', part.id)
    .where('unit_id', 'is', null)
    .forUpdate()
    .executeTakeFirst();
  if (!content || content.qty < qty)
    throw new InvalidError(`The box holds ${content?.qty ?? 0} of ${part.name}.`, {
      qty: [`at most ${content?.qty ?? 0}`],
    });
  if (content.qty > qty)
    await scoped(trx, ctx)
      .updateTable('kit_box_contents')
      .set({ qty: content.qty - qty })
      .where('id', '=', content.id)
      .execute();
  else await scoped(trx, ctx).deleteFrom('kit_box_contents').where('id', '=', content.id).execute();

  const note = [`out of ${box.name}, ${DESTINATION_WORDS[to]}`, opts.reason].filter(Boolean).join(': ');
  const movement = {
    space_id: ctx.spaceId,
    part_id: part.id,
    unit_id: null,
    ref_type: 'kit_box',
    ref_id: box.id,
    note,
    actor_id: ctx.userId,
    created_at: opts.at,
  };
  if (to !== 'shelf') {
    // Written off: no bin's stock changes (location null), as with a short return.
    await scoped(trx, ctx)
      .insertInto('stock_movements')
      .values({
        ...movement,
        location_id: null,
        qty_delta: -qty,
        reason: to === 'repair' ? 'damaged' : 'lost',
      })
      .execute();
    return;
  }
  const bin = await binFor(trx, ctx, box, part.id, opts.locationId);
  if (!bin)
    throw new InvalidError(`Say which bin ${part.name} goes back to.`, {
      locationId: ['choose a bin for the counted parts'],
    });
  await scoped(trx, ctx)
    .insertInto('stock')
    .values({ space_id: ctx.spaceId, part_id: part.id, location_id: bin, qty, updated_at: opts.at })
    .onConflict((oc) =>
      oc
        .columns(['part_id', 'location_id'])
        .doUpdateSet((eb) => ({ qty: eb('stock.qty', '+', qty), updated_at: opts.at })),
    )
    .execute();
  await scoped(trx, ctx)
    .insertInto('stock_movements')
    .values({ ...movement, location_id: bin, qty_delta: qty, reason: 'move_in' })
    .execute();
}

/**
 * Before a refill: whatever the box holds beyond its template (a part the template dropped, such as
 * the old driver after the template's driver changed, or more than the template's quantity) goes
 * back on the shelf, so the refill replaces rather than adds beside. Chain roles follow the template.
 */
export async function removeSurplus(
  trx: Db,
  ctx: Ctx,
  box: BoxRef & { templateId: string },
  at: Date,
  locationId?: string | null,
): Promise<string[]> {
  const want = new Map(
    (
      await scoped(trx, ctx)
        .selectFrom('kit_template_lines')
        .select(['part_id', 'qty', 'chain_role'])
        .where('template_id', '=', box.templateId)
        .execute()
    ).map((l) => [l.part_id, l]),
  );
  const contents = await scoped(trx, ctx)
    .selectFrom('kit_box_contents as c')
    .innerJoin('parts', 'parts.id', 'c.part_id')
    .leftJoin('units', 'units.id', 'c.unit_id')
    .select([
      'c.part_id as partId',
      'c.unit_id as unitId',
      'c.qty',
      'c.chain_role as chainRole',
      'parts.name',
      'units.code',
    ])
    .where('c.kit_box_id', '=', box.id)
    .orderBy('units.code')
    .execute();
  const removed: string[] = [];
  const byPart = new Map<string, typeof contents>();
  for (const c of contents) byPart.set(c.partId, [...(byPart.get(c.partId) ?? []), c]);
  for (const [partId, rows] of byPart) {
    const line = want.get(partId);
    let surplus = rows.reduce((n, r) => n + r.qty, 0) - (line?.qty ?? 0);
    // Newest labels go first; a counted row gives up its surplus in one go.
    for (const r of [...rows].reverse()) {
      if (surplus <= 0) break;
      if (r.unitId) {
        await unitOut(trx, ctx, box, { id: r.unitId, partId, code: r.code ?? '' }, 'shelf', {
          at,
          locationId,
          reason: 'no longer on the kit list',
        });
        removed.push(`${r.name} (${r.code})`);
        surplus -= 1;
      } else {
        const n = Math.min(surplus, r.qty);
        await countedOut(trx, ctx, box, { id: partId, name: r.name }, n, 'shelf', {
          at,
          locationId,
          reason: 'no longer on the kit list',
        });
        removed.push(`${n} × ${r.name}`);
        surplus -= n;
      }
    }
    if (line && rows.some((r) => r.chainRole !== line.chain_role))
      await scoped(trx, ctx)
        .updateTable('kit_box_contents')
        .set({ chain_role: line.chain_role })
        .where('kit_box_id', '=', box.id)
        .where('part_id', '=', partId)
        .execute();
  }
  return removed;
}
