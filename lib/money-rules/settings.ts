import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';
import type { TaxRule } from '@/lib/sales/tax';
import { readMoneyRules, type MoneyRules, type MoneyRulesPatch } from './schema';

// The space's money rules live in spaces.settings.money; other keys of settings are left alone.
// `forUpdate` locks the space row, so a sale priced in a transaction uses the rate that was in force
// when it was written, never half of a change.

export async function moneyRules(db: Db, spaceId: string): Promise<MoneyRules> {
  const row = await db.selectFrom('spaces').select('settings').where('id', '=', spaceId).executeTakeFirst();
  if (!row) throw new NotFoundError('No such space.');
  return readMoneyRules((row.settings as Record<string, unknown> | null)?.money);
}

export const taxRuleOf = (r: MoneyRules): TaxRule =>
  r.taxMode === 'exempt' ? { mode: 'exempt', rateBp: 0 } : { mode: r.taxMode, rateBp: r.taxRateBp };

/** Merges the patch over the stored rules (account codes per category); the audit row keeps what changed. */
export async function updateMoneyRules(db: Db, ctx: Ctx, patch: MoneyRulesPatch): Promise<MoneyRules> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .selectFrom('spaces')
      .select('settings')
      .where('id', '=', ctx.spaceId)
      .forNoKeyUpdate()
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such space.');
    const before = readMoneyRules((row.settings as Record<string, unknown> | null)?.money);
    const after: MoneyRules = { ...before, accountCodes: { ...before.accountCodes } };
    const changed: Record<string, { from: unknown; to: unknown }> = {};
    for (const key of Object.keys(before) as (keyof MoneyRules)[]) {
      let value = patch[key];
      if (value === undefined) continue;
      if (key === 'accountCodes') {
        // Codes merge per category; an empty code removes that category's code.
        const merged: Record<string, string> = { ...before.accountCodes };
        for (const [c, code] of Object.entries(value as Record<string, string | undefined>)) {
          if (code === undefined) continue;
          if (code === '') delete merged[c];
          else merged[c] = code;
        }
        value = merged;
      }
      if (JSON.stringify(value) === JSON.stringify(before[key])) continue;
      (after as Record<string, unknown>)[key] = value;
      changed[key] = { from: before[key], to: value };
    }
    if (!Object.keys(changed).length) return before;
    await trx
      .updateTable('spaces')
      .set({ settings: sql`jsonb_set(settings, '{money}', ${JSON.stringify(after)}::jsonb, true)` })
      .where('id', '=', ctx.spaceId)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'money_rules.updated',
      targetType: 'space',
      targetId: ctx.spaceId,
      detail: { changed },
    });
    return after;
  });
}
