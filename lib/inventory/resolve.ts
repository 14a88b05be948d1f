import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { builtOnce } from '@/db/built-once';
import { scoped } from '@/db/scoped';
import type { LabelKind } from '@/db/types';
import { codeFromScan } from '@/labels/url';
import type { Ctx } from '@/lib/auth/roles';
import { InvalidError, NotFoundError } from '@/lib/errors';

export type Resolved = {
  code: string;
  kind: LabelKind;
  targetId: string;
  name: string;
  /** Where the thing's page is. */
  href: string;
  partId?: string;
  state?: string;
};

/** The page of each kind of thing; kit box pages live with the kits. */
export function hrefFor(
  kind: LabelKind,
  targetId: string,
  extra: { partId?: string; code?: string } = {},
): string {
  switch (kind) {
    case 'unit':
      return `/shelf/parts/${extra.partId}?unit=${extra.code}#unit-${extra.code}`;
    case 'part':
      return `/shelf/parts/${targetId}`;
    case 'location':
      return `/shelf/locations/${targetId}`;
    case 'kit_box':
      return `/kits/boxes/${targetId}`;
  }
}

/**
 * Label rows of the space joined to what each labels, in one round trip (the scan path is the
 * hottest read in the product). A label whose item is gone comes back with a null name.
 */
function labelsWithTargets(db: Db, spaceId: string, codes: string[]) {
  return labelsQuery(db, spaceId, codes).execute();
}

function labelsQuery(db: Db, spaceId: string, codes: string[]) {
  return scoped(db, { spaceId })
    .selectFrom('label_codes as lc')
    .leftJoin('units as u', (j) =>
      j.onRef('u.id', '=', 'lc.target_id').on('lc.kind', '=', 'unit').onRef('u.space_id', '=', 'lc.space_id'),
    )
    .leftJoin('parts as up', 'up.id', 'u.part_id')
    .leftJoin('parts as p', (j) =>
      j.onRef('p.id', '=', 'lc.target_id').on('lc.kind', '=', 'part').onRef('p.space_id', '=', 'lc.space_id'),
    )
    .leftJoin('locations as l', (j) =>
      j
        .onRef('l.id', '=', 'lc.target_id')
        .on('lc.kind', '=', 'location')
        .onRef('l.space_id', '=', 'lc.space_id'),
    )
    .leftJoin('kit_boxes as k', (j) =>
      j
        .onRef('k.id', '=', 'lc.target_id')
        .on('lc.kind', '=', 'kit_box')
        .onRef('k.space_id', '=', 'lc.space_id'),
    )
    .select([
      'lc.code',
      'lc.kind',
      'lc.target_id',
      sql<
        string | null
      >`coalesce(up.name || coalesce(' (' || u.serial || ')', ''), p.name, l.name, k.name)`.as('name'),
      sql<string | null>`coalesce(u.part_id, p.id)`.as('part_id'),
      sql<string | null>`coalesce(u.state, k.state)`.as('state'),
    ])
    .where('lc.space_id', '=', spaceId)
    .where('lc.code', 'in', codes);
}

/** The same statement for one code, built once per process (db/built-once.ts): every scan runs it. */
const labelWithTarget = builtOnce('label_with_target', (db, spaceId: string, code: string) => labelsQuery(db, spaceId, [code]));

type LabelRow = Awaited<ReturnType<typeof labelsWithTargets>>[number];

function toResolved(row: LabelRow & { name: string }): Resolved {
  const partId = row.part_id ?? undefined;
  return {
    code: row.code,
    kind: row.kind,
    targetId: row.target_id,
    name: row.name,
    ...(partId ? { partId } : {}),
    ...(row.state ? { state: row.state } : {}),
    href: hrefFor(row.kind, row.target_id, { partId, code: row.code }),
  };
}

/**
 * A scanned or typed code (bare, with hyphens, or a full `<base>/s/<code>` URL) → the thing it
 * labels, in the caller's space only: another space's code answers "not found", like no code at all.
 */
export async function resolveCode(db: Db, ctx: Pick<Ctx, 'spaceId'>, input: string): Promise<Resolved> {
  const checked = codeFromScan(input);
  if (!checked.ok) throw new InvalidError(checked.message, { code: [checked.message] });
  const [row] = await labelWithTarget(db, ctx.spaceId, checked.code);
  if (!row) throw new NotFoundError('No label with this code here.');
  if (row.name === null) throw new NotFoundError('This label’s item no longer exists.');
  return toResolved({ ...row, name: row.name });
}

/** Which of these codes exist in the space (for "did you mean"), with what they label, in the order given. */
export async function existingCodes(db: Db, ctx: Pick<Ctx, 'spaceId'>, codes: string[]): Promise<Resolved[]> {
  const clean = [...new Set(codes.map((c) => codeFromScan(c)).flatMap((c) => (c.ok ? [c.code] : [])))];
  if (!clean.length) return [];
  const rows = await labelsWithTargets(db, ctx.spaceId, clean);
  return clean.flatMap((c) => {
    const row = rows.find((r) => r.code === c);
    return row && row.name !== null ? [toResolved({ ...row, name: row.name })] : [];
  });
}
