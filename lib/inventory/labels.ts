import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { LabelKind } from '@/db/types';
import { getLayout, LAYOUTS } from '@/labels/layouts';
import type { LabelItem } from '@/labels/schema';
import { codeFromScan, labelUrl } from '@/labels/url';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { InvalidError, type FieldErrors } from '@/lib/errors';
import type { LabelSelection } from './schemas';
import { findLocation, findPart } from './scope';
import { CATEGORY_WORDS } from './schemas';
import { keySpec } from './specs';

// Which labels a print run holds. A selection (a part's units, a bin and what is in it, a list of
// codes, or every code issued today) becomes label items: code, URL for the QR, name, one key spec.

type LabelRef = { code: string; kind: LabelKind; target_id: string };

const byCode = (db: Db, spaceId: string) =>
  scoped(db, { spaceId }).selectFrom('label_codes').select(['code', 'kind', 'target_id']).where('space_id', '=', spaceId);

async function refsFor(db: Db, ctx: Pick<Ctx, 'spaceId'>, selection: LabelSelection): Promise<LabelRef[]> {
  switch (selection.kind) {
    case 'part': {
      const part = await findPart(db, ctx, selection.partId);
      const units =
        part.tracking === 'unit'
          ? await scoped(db, ctx)
              .selectFrom('units')
              .select(['code', sql<LabelKind>`'unit'`.as('kind'), 'id as target_id'])
              .where('part_id', '=', part.id)
              .where('state', '<>', 'retired')
              .orderBy('serial')
              .orderBy('created_at')
              .execute()
          : [];
      const own =
        part.code && (part.tracking === 'counted' || selection.includePart)
          ? [{ code: part.code, kind: 'part' as const, target_id: part.id }]
          : [];
      return [...own, ...units];
    }
    case 'location': {
      const loc = await findLocation(db, ctx, selection.locationId);
      const own = loc.code ? [{ code: loc.code, kind: 'location' as const, target_id: loc.id }] : [];
      if (!selection.contents) return own;
      const contents = await scoped(db, ctx)
        .selectFrom('units')
        .select(['code', sql<LabelKind>`'unit'`.as('kind'), 'id as target_id'])
        .where('location_id', '=', loc.id)
        .where('state', '<>', 'retired')
        .unionAll(
          scoped(db, ctx)
            .selectFrom('stock')
            .innerJoin('parts', 'parts.id', 'stock.part_id')
            .select([
              sql<string>`parts.code`.as('code'),
              sql<LabelKind>`'part'`.as('kind'),
              'parts.id as target_id',
            ])
            .where('stock.location_id', '=', loc.id)
            .where('stock.qty', '>', 0)
            .where('parts.code', 'is not', null),
        )
        .unionAll(
          scoped(db, ctx)
            .selectFrom('kit_boxes')
            .select(['code', sql<LabelKind>`'kit_box'`.as('kind'), 'id as target_id'])
            .where('location_id', '=', loc.id)
            .where('space_id', '=', ctx.spaceId),
        )
        .execute();
      return [...own, ...contents];
    }
    case 'codes': {
      // Each refusal names the code as typed, in words, so the message alone says which one is wrong.
      const fields: FieldErrors = {};
      const said: string[] = [];
      const wanted = selection.codes.map((raw, i) => {
        const c = codeFromScan(raw);
        if (!c.ok) {
          fields[`selection.codes.${i}`] = [`“${raw}”: ${c.message}`];
          said.push(`“${raw}” is not a label code (${c.message.replace(/\.$/, '').replace(/^./, (ch) => ch.toLowerCase())})`);
        }
        return c.ok ? c.code : '';
      });
      const found = wanted.some(Boolean)
        ? await byCode(db, ctx.spaceId).where('code', 'in', wanted.filter(Boolean)).execute()
        : [];
      const map = new Map(found.map((f) => [f.code, f]));
      wanted.forEach((c, i) => {
        if (c && !map.has(c)) {
          fields[`selection.codes.${i}`] = [`“${selection.codes[i]}”: no label with this code in this space`];
          said.push(`no label in this space has the code “${selection.codes[i]}”`);
        }
      });
      if (said.length)
        throw new InvalidError(`Nothing printed: ${said.join('; ')}. Correct ${said.length === 1 ? 'it' : 'them'} and try again.`, fields);
      return wanted.map((c) => map.get(c)!);
    }
    case 'today': {
      const space = await db
        .selectFrom('spaces')
        .select('time_zone')
        .where('id', '=', ctx.spaceId)
        .executeTakeFirstOrThrow();
      // Midnight of the space's own day, whatever the server's zone.
      const since = sql<Date>`date_trunc('day', ${now()}::timestamptz at time zone ${space.time_zone}) at time zone ${space.time_zone}`;
      return byCode(db, ctx.spaceId)
        .where('created_at', '>=', since)
        .orderBy('created_at')
        .orderBy('code')
        .execute();
    }
  }
}

/** Names and key specs for many labels in a handful of queries. */
async function describeAll(
  db: Db,
  spaceId: string,
  refs: LabelRef[],
): Promise<Map<string, { name: string; spec?: string }>> {
  const ids = (kind: LabelKind) => refs.filter((r) => r.kind === kind).map((r) => r.target_id);
  const none = Promise.resolve([]);
  const [units, parts, locations, boxes] = await Promise.all([
    ids('unit').length
      ? scoped(db, { spaceId })
          .selectFrom('units')
          .innerJoin('parts', 'parts.id', 'units.part_id')
          .select(['units.id', 'parts.name', 'parts.sku', 'parts.category', 'parts.specs'])
          .where('units.id', 'in', ids('unit'))
          .where('units.space_id', '=', spaceId)
          .execute()
      : none,
    ids('part').length
      ? scoped(db, { spaceId })
          .selectFrom('parts')
          .select(['id', 'name', 'sku', 'category', 'specs'])
          .where('id', 'in', ids('part'))
          .where('space_id', '=', spaceId)
          .execute()
      : none,
    ids('location').length
      ? scoped(db, { spaceId })
          .selectFrom('locations')
          .select(['id', 'name', 'kind'])
          .where('id', 'in', ids('location'))
          .where('space_id', '=', spaceId)
          .execute()
      : none,
    ids('kit_box').length
      ? scoped(db, { spaceId })
          .selectFrom('kit_boxes')
          .innerJoin('kit_templates', 'kit_templates.id', 'kit_boxes.template_id')
          .select(['kit_boxes.id', 'kit_boxes.name', 'kit_templates.name as template'])
          .where('kit_boxes.id', 'in', ids('kit_box'))
          .where('kit_boxes.space_id', '=', spaceId)
          .execute()
      : none,
  ]);
  const out = new Map<string, { name: string; spec?: string }>();
  const partSpec = (p: {
    category: keyof typeof CATEGORY_WORDS;
    specs: Record<string, unknown>;
    sku: string;
  }) => keySpec(p.category, p.specs) || p.sku;
  for (const u of units) out.set(`unit:${u.id}`, { name: u.name, spec: partSpec(u) });
  for (const p of parts) out.set(`part:${p.id}`, { name: p.name, spec: partSpec(p) });
  for (const l of locations) out.set(`location:${l.id}`, { name: l.name, spec: l.kind });
  for (const b of boxes) out.set(`kit_box:${b.id}`, { name: b.name, spec: `Kit: ${b.template}` });
  return out;
}

/** The label items of a selection, ready for labels/pdf.ts. Throws 400 when the selection holds nothing. */
export async function labelItemsFor(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  selection: LabelSelection,
  baseUrl: string,
): Promise<LabelItem[]> {
  const refs = await refsFor(db, ctx, selection);
  const seen = new Set<string>();
  const unique = refs.filter((r) => !seen.has(r.code) && seen.add(r.code));
  const described = await describeAll(db, ctx.spaceId, unique);
  const items = unique
    .map((r) => {
      const d = described.get(`${r.kind}:${r.target_id}`);
      return d ? { code: r.code, url: labelUrl(baseUrl, r.code), name: d.name, spec: d.spec } : null;
    })
    .filter((i): i is NonNullable<typeof i> => i !== null);
  if (!items.length)
    throw new InvalidError('Nothing to print in this selection.', {
      selection: ['this selection has no labels'],
    });
  return items;
}

/** The layout to print on: the one asked for, else the space's own, else the first we know. */
export async function chooseLayout(db: Db, ctx: Pick<Ctx, 'spaceId'>, asked?: string): Promise<string> {
  if (asked) {
    if (!getLayout(asked))
      throw new InvalidError(`Unknown label layout "${asked}".`, {
        layoutId: [`choose one of ${LAYOUTS.map((l) => l.id).join(', ')}`],
      });
    return asked;
  }
  const space = await db
    .selectFrom('spaces')
    .select('label_layout')
    .where('id', '=', ctx.spaceId)
    .executeTakeFirstOrThrow();
  return getLayout(space.label_layout) ? space.label_layout : LAYOUTS[0].id;
}
