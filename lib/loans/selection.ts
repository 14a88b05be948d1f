import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { builtOnce } from '@/db/built-once';
import { scoped } from '@/db/scoped';
import type { ChainRole, PartCategory, UnitState } from '@/db/types';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import type { CheckLine } from './check';
import type { Selection } from './schemas';

// Turns a selection (a kit box, or loose units plus counted stock) into the lines of a loan, with the
// stored specs of the exact parts. Used by the preview (no locks) and inside the borrow transaction.

export type SelectionLine = CheckLine & {
  sku: string;
  unitId: string | null;
  unitCode: string | null;
  unitState: UnitState | null;
  /** Bin the counted stock comes from; null for a kit box's contents and for units. */
  locationId: string | null;
  locationName: string | null;
  lendable: boolean;
  tracking: 'counted' | 'unit';
};

/** Kit boxes of a space with their template and shelf: the base of every box query. */
export const boxesOfSpace = (db: Db, spaceId: string) =>
  scoped(db, { spaceId })
    .selectFrom('kit_boxes')
    .innerJoin('kit_templates', 'kit_templates.id', 'kit_boxes.template_id')
    .leftJoin('locations', 'locations.id', 'kit_boxes.location_id')
    .select([
      'kit_boxes.id',
      'kit_boxes.name',
      'kit_boxes.code',
      'kit_boxes.state',
      'kit_boxes.template_id as templateId',
      'kit_templates.name as templateName',
      'locations.name as locationName',
    ])
    .where('kit_boxes.space_id', '=', spaceId);

export type SelectedBox = {
  id: string;
  name: string;
  code: string;
  state: UnitState;
  templateId: string;
  templateName: string;
  locationName: string | null;
};

export type ResolvedSelection = { box: SelectedBox | null; lines: SelectionLine[] };

export async function loadBox(db: Db, spaceId: string, kitBoxId: string): Promise<SelectedBox> {
  const box = await boxesOfSpace(db, spaceId).where('kit_boxes.id', '=', kitBoxId).executeTakeFirst();
  if (!box) throw new NotFoundError('No such kit box.');
  return box;
}

export async function boxLines(db: Db, spaceId: string, kitBoxId: string): Promise<SelectionLine[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('kit_box_contents as c')
    .innerJoin('parts', 'parts.id', 'c.part_id')
    .leftJoin('units', 'units.id', 'c.unit_id')
    .select([
      'c.part_id as partId',
      ...PART_COLUMNS,
      'c.qty',
      'c.chain_role as chainRole',
      'c.unit_id as unitId',
      'units.code as unitCode',
      'units.state as unitState',
    ])
    .where('c.kit_box_id', '=', kitBoxId)
    .orderBy(
      sql`case c.chain_role when 'supply' then 0 when 'driver' then 1 when 'led' then 2 when 'wire' then 3 else 4 end`,
    )
    .orderBy('parts.name')
    .execute();
  return rows.map((r) => ({ ...r, locationId: null, locationName: null }));
}

// The part's own columns every line carries.
const PART_COLUMNS = [
  'parts.name',
  'parts.sku',
  'parts.category',
  'parts.specs',
  'parts.lendable',
  'parts.tracking',
] as const;
type PartRow = {
  partId: string;
  name: string;
  sku: string;
  category: string;
  specs: Record<string, unknown>;
  lendable: boolean;
  tracking: 'counted' | 'unit';
};

function looseLine(
  p: PartRow,
  rest: Pick<SelectionLine, 'qty' | 'unitId' | 'unitCode' | 'unitState' | 'locationId' | 'locationName'>,
): SelectionLine {
  return { ...p, category: p.category as PartCategory, chainRole: null, ...rest };
}

/** Loose units and counted stock, each checked to belong to the space and to be lendable. */
/** A counted line's part and bin, in the space. Built once per process: every loose borrow reads it. */
const countedLine = builtOnce('counted_line', (db, spaceId: string, partId: string, locationId: string) =>
  scoped(db, { spaceId })
    .selectFrom('parts')
    .innerJoin('locations', (j) => j.on('locations.id', '=', locationId).on('locations.space_id', '=', spaceId))
    .select(['parts.id as partId', ...PART_COLUMNS, 'locations.name as locationName'])
    .where('parts.id', '=', partId)
    .where('parts.space_id', '=', spaceId),
);

export async function looseLines(
  db: Db,
  spaceId: string,
  sel: { unitIds: string[]; counted: { partId: string; locationId: string; qty: number }[] },
): Promise<SelectionLine[]> {
  const lines: SelectionLine[] = [];
  if (sel.unitIds.length) {
    const units = await scoped(db, { spaceId })
      .selectFrom('units')
      .innerJoin('parts', 'parts.id', 'units.part_id')
      .leftJoin('kit_boxes', 'kit_boxes.id', 'units.kit_box_id')
      .select([
        'units.id',
        'units.code',
        'units.state',
        'units.kit_box_id',
        'kit_boxes.name as boxName',
        'parts.id as partId',
        ...PART_COLUMNS,
      ])
      .where('units.id', 'in', sel.unitIds)
      .where('units.space_id', '=', spaceId)
      .execute();
    sel.unitIds.forEach((id, i) => {
      const u = units.find((x) => x.id === id);
      if (!u) throw new NotFoundError(`Unit ${i + 1} of the list is not in this space.`);
      if (u.kit_box_id)
        throw new ConflictError(`${u.name} (${u.code}) belongs in ${u.boxName}; borrow the box instead.`, {
          [`unitIds.${i}`]: ['part of a kit box'],
        });
      lines.push(
        looseLine(u, {
          qty: 1,
          unitId: u.id,
          unitCode: u.code,
          unitState: u.state,
          locationId: null,
          locationName: null,
        }),
      );
    });
  }
  for (const [i, c] of sel.counted.entries()) {
    const [row] = await countedLine(db, spaceId, c.partId, c.locationId);
    if (!row) throw new NotFoundError(`Counted line ${i + 1}: no such part or bin in this space.`);
    if (row.tracking !== 'counted')
      throw new InvalidError(`${row.name} has labelled units; scan the unit instead.`, {
        [`counted.${i}.partId`]: ['this part has labelled units'],
      });
    lines.push(
      looseLine(row, {
        qty: c.qty,
        unitId: null,
        unitCode: null,
        unitState: null,
        locationId: c.locationId,
        locationName: row.locationName,
      }),
    );
  }
  lines.forEach((l, i) => {
    if (!l.lendable) {
      const field = l.unitId
        ? `unitIds.${sel.unitIds.indexOf(l.unitId)}`
        : `counted.${i - sel.unitIds.length}.partId`;
      throw new InvalidError(`${l.name} is not lent out (it is sold at the counter).`, {
        [field]: ['not lendable'],
      });
    }
  });
  return lines;
}

export async function resolveSelection(db: Db, spaceId: string, sel: Selection): Promise<ResolvedSelection> {
  if ('kitBoxId' in sel) {
    const box = await loadBox(db, spaceId, sel.kitBoxId);
    return { box, lines: await boxLines(db, spaceId, box.id) };
  }
  return { box: null, lines: await looseLines(db, spaceId, sel) };
}

export const chainRoleOf = (l: { chainRole: ChainRole | null; category: PartCategory }): ChainRole | null =>
  l.chainRole ??
  (['supply', 'driver', 'led', 'wire'].includes(l.category) ? (l.category as ChainRole) : null);
