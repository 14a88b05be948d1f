import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { LabelKind } from '@/db/types';
import { newCode } from '@/labels/code';

/**
 * Registers a fresh label code for a unit, part, bin or kit box. 2^30 codes make a clash rare;
 * `on conflict do nothing` turns one into another draw instead of an error.
 */
export async function issueCode(db: Db, spaceId: string, kind: LabelKind, targetId: string): Promise<string> {
  for (let attempt = 0; attempt < 10; attempt++) {
    const row = await scoped(db, { spaceId })
      .insertInto('label_codes')
      .values({ code: newCode(), space_id: spaceId, kind, target_id: targetId })
      .onConflict((oc) => oc.column('code').doNothing())
      .returning('code')
      .executeTakeFirst();
    if (row) return row.code;
  }
  throw new Error('issueCode: no free label code after 10 draws');
}

/** One fresh code per target, in batches: a clash only redraws the clashing ones. Same order as `targetIds`. */
export async function issueCodes(
  db: Db,
  spaceId: string,
  kind: LabelKind,
  targetIds: string[],
): Promise<string[]> {
  const codes = new Map<string, string>();
  for (let attempt = 0; codes.size < targetIds.length; attempt++) {
    if (attempt >= 10) throw new Error('issueCodes: no free label codes after 10 rounds');
    const wanted = targetIds.filter((id) => !codes.has(id)).map((id) => ({ id, code: newCode() }));
    const unique = [...new Map(wanted.map((w) => [w.code, w])).values()];
    const rows = await scoped(db, { spaceId })
      .insertInto('label_codes')
      .values(unique.map((w) => ({ code: w.code, space_id: spaceId, kind, target_id: w.id })))
      .onConflict((oc) => oc.column('code').doNothing())
      .returning(['code', 'target_id'])
      .execute();
    for (const r of rows) codes.set(r.target_id, r.code);
  }
  return targetIds.map((id) => codes.get(id)!);
}
