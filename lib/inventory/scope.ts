import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';
import { isId } from '@/lib/ids';

// Every lookup by id is scoped to the caller's space: another space's record is simply "not found".
type Scope = Pick<Ctx, 'spaceId'>;

/** A malformed id can name nothing: answer 404 rather than let PostgreSQL reject the cast. */
export function assertId(id: string, what = 'record'): void {
  if (!isId(id)) throw new NotFoundError(`No such ${what}.`);
}

export async function findPart(db: Db, ctx: Scope, id: string) {
  assertId(id, 'part');
  const part = await scoped(db, ctx)
    .selectFrom('parts')
    .selectAll()
    .where('id', '=', id)
    .where('space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!part) throw new NotFoundError('No such part.');
  return part;
}

export async function findLocation(db: Db, ctx: Scope, id: string) {
  assertId(id, 'location');
  const loc = await scoped(db, ctx)
    .selectFrom('locations')
    .selectAll()
    .where('id', '=', id)
    .where('space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!loc) throw new NotFoundError('No such location.');
  return loc;
}

/** A part's name, SKU and tracking when `id` names one in the space (for a form's preselected part); else null. */
export async function findPartSummary(db: Db, ctx: Scope, id: string | undefined) {
  if (!isId(id)) return null;
  const p = await scoped(db, ctx)
    .selectFrom('parts')
    .select(['id', 'name', 'sku', 'tracking', 'sale_unit as saleUnit'])
    .where('id', '=', id)
    .where('space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  return p ?? null;
}
