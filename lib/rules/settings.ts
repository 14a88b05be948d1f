import 'server-only';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { patchSection, readSection } from '@/lib/settings/section';
import { readRules, type BorrowingRules, type BorrowingRulesPatch } from './schema';

// The space's borrowing rules live in spaces.settings.borrowing; other keys of settings are left alone.

export async function borrowingRules(db: Db, spaceId: string): Promise<BorrowingRules> {
  return readSection(db, spaceId, 'borrowing', readRules);
}

/** Merges the patch over the stored rules; the audit row keeps what each changed rule was before. */
export async function updateBorrowingRules(db: Db, ctx: Ctx, patch: BorrowingRulesPatch): Promise<BorrowingRules> {
  return patchSection(db, ctx, 'borrowing', readRules, () => patch, 'borrowing_rules.updated');
}
