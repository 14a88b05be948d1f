import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';

// A space's rules that are not columns of `spaces` live in one key of `spaces.settings` each (borrowing,
// money, restocking). Reading one and patching one are the same for every key: the row is locked while
// the patch is merged, only that key is rewritten, and the audit row names each field that changed with
// what it was. (No server-only here: the demo seed reads the money rules through this file.)

export type SettingsSection = 'borrowing' | 'money' | 'restocking';
export type Changes = Record<string, { from: unknown; to: unknown }>;

/** The stored section as `read` makes sense of it (a default per field). */
export async function readSection<T>(db: Db, spaceId: string, key: SettingsSection, read: (raw: unknown) => T): Promise<T> {
  const row = await db.selectFrom('spaces').select('settings').where('id', '=', spaceId).executeTakeFirst();
  if (!row) throw new NotFoundError('No such space.');
  return read((row.settings as Record<string, unknown> | null)?.[key]);
}

/** The fields of `patch` that differ from `before`, applied; an undefined field is left as it was. */
export function applyPatch<T extends object>(before: T, patch: Partial<T>): { after: T; changed: Changes } {
  const after = { ...before };
  const changed: Changes = {};
  for (const key of Object.keys(before) as (keyof T & string)[]) {
    const value = patch[key];
    if (value === undefined || JSON.stringify(value) === JSON.stringify(before[key])) continue;
    after[key] = value as T[keyof T & string];
    changed[key] = { from: before[key], to: value };
  }
  return { after, changed };
}

/** One transaction: lock the space row, merge, write the section back when something changed, audit it. */
export async function patchSection<T extends object>(
  db: Db,
  ctx: Ctx,
  key: SettingsSection,
  read: (raw: unknown) => T,
  patch: (before: T) => Partial<T>,
  action: string,
): Promise<T> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .selectFrom('spaces')
      .select('settings')
      .where('id', '=', ctx.spaceId)
      .forNoKeyUpdate()
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such space.');
    const before = read((row.settings as Record<string, unknown> | null)?.[key]);
    const { after, changed } = applyPatch(before, patch(before));
    if (!Object.keys(changed).length) return before;
    await trx
      .updateTable('spaces')
      .set({ settings: sql`jsonb_set(settings, ${`{${key}}`}::text[], ${JSON.stringify(after)}::jsonb, true)` })
      .where('id', '=', ctx.spaceId)
      .execute();
    await audit(trx, { spaceId: ctx.spaceId, actorId: ctx.userId, action, targetType: 'space', targetId: ctx.spaceId, detail: { changed } });
    return after;
  });
}
