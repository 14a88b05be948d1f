import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';
import { readRules, type BorrowingRules, type BorrowingRulesPatch } from './schema';

// The space's borrowing rules live in spaces.settings.borrowing; other keys of settings are left alone.

export async function borrowingRules(db: Db, spaceId: string): Promise<BorrowingRules> {
  const row = await db.selectFrom('spaces').select('settings').where('id', '=', spaceId).executeTakeFirst();
  if (!row) throw new NotFoundError('No such space.');
  return readRules((row.settings as Record<string, unknown> | null)?.borrowing);
}

/** Merges the patch over the stored rules; the audit row keeps what each changed rule was before. */
export async function updateBorrowingRules(db: Db, ctx: Ctx, patch: BorrowingRulesPatch): Promise<BorrowingRules> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .selectFrom('spaces')
      .select('settings')
      .where('id', '=', ctx.spaceId)
      .forNoKeyUpdate()
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such space.');
    const before = readRules((row.settings as Record<string, unknown> | null)?.borrowing);
    const after: BorrowingRules = { ...before };
    const changed: Record<string, { from: unknown; to: unknown }> = {};
    for (const key of Object.keys(before) as (keyof BorrowingRules)[]) {
      const value = patch[key];
      if (value === undefined || JSON.stringify(value) === JSON.stringify(before[key])) continue;
      (after as Record<string, unknown>)[key] = value;
      changed[key] = { from: before[key], to: value };
    }
    if (!Object.keys(changed).length) return before;
    await trx
      .updateTable('spaces')
      .set({ settings: sql`jsonb_set(settings, '{borrowing}', ${JSON.stringify(after)}::jsonb, true)` })
      .where('id', '=', ctx.spaceId)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'borrowing_rules.updated',
      targetType: 'space',
      targetId: ctx.spaceId,
      detail: { changed },
    });
    return after;
  });
}
