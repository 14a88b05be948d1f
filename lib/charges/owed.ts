import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';

/** What a member owes in a space: every charge less what its deposit covered and what was settled. Minor units. */
export async function owedBy(db: Db, spaceId: string, userId: string): Promise<number> {
  const row = await scoped(db, { spaceId })
    .selectFrom('charges')
    .select(sql<string>`coalesce(sum(amount_minor - from_deposit_minor - settled_minor), 0)`.as('owed'))
    .where('user_id', '=', userId)
    .executeTakeFirstOrThrow();
  return Number(row.owed);
}
