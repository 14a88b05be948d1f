import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { patchSection, readSection } from '@/lib/settings/section';
import type { TaxRule } from '@/lib/sales/tax';
import { readMoneyRules, type MoneyRules, type MoneyRulesPatch } from './schema';

// The space's money rules live in spaces.settings.money; other keys of settings are left alone.
// A change locks the space row (patchSection), so a sale priced in a transaction uses the rate that was in force
// when it was written, never half of a change.

export async function moneyRules(db: Db, spaceId: string): Promise<MoneyRules> {
  return readSection(db, spaceId, 'money', readMoneyRules);
}

export const taxRuleOf = (r: MoneyRules): TaxRule =>
  r.taxMode === 'exempt' ? { mode: 'exempt', rateBp: 0 } : { mode: r.taxMode, rateBp: r.taxRateBp };

/** Codes merge per category; an empty code removes that category's code. */
function mergeCodes(before: Record<string, string>, patch: Record<string, string | undefined>): Record<string, string> {
  const merged: Record<string, string> = { ...before };
  for (const [c, code] of Object.entries(patch)) {
    if (code === undefined) continue;
    if (code === '') delete merged[c];
    else merged[c] = code;
  }
  return merged;
}

/** Merges the patch over the stored rules (account codes per category); the audit row keeps what changed. */
export async function updateMoneyRules(db: Db, ctx: Ctx, patch: MoneyRulesPatch): Promise<MoneyRules> {
  return patchSection(
    db,
    ctx,
    'money',
    readMoneyRules,
    (before) => ({
      ...patch,
      accountCodes: patch.accountCodes ? mergeCodes(before.accountCodes, patch.accountCodes) : undefined,
    }) as Partial<MoneyRules>,
    'money_rules.updated',
  );
}
