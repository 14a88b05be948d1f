import 'server-only';
import { scoped } from '@/db/scoped';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';

// Erasing a person on request (their right to erasure), with the books kept whole. The person's row
// stays — loans, sales, refunds, stock movements and the audit point at it by id — but it becomes an
// anonymous placeholder: name and e-mail replaced, password, calendar feed, sessions and sign-in links
// gone, access switched off. Every text and JSON column of this space's tables (notes, override reasons,
// audit details, stored processor events) has the person's name and e-mail replaced by the placeholder.
// Amounts, quantities and dates are not touched, so totals and stock history read exactly as before.
//
// Refused while it would lose track of something: a loan still out, a card sale still pending; and for
// a person who is also in another space (that space's admins have a say), or for oneself.

export type EraseInput = { confirmEmail: string };

const TEXT_TYPES = new Set(['text', 'character varying', 'citext', 'jsonb', 'json']);
const escapeRegex = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Replaces each needle (case-insensitively) in every text or JSON column of this space's tables. */
async function scrubSpaceText(trx: Db, spaceId: string, needles: string[], placeholder: string): Promise<number> {
  const pattern = needles.filter((n) => n.trim().length >= 3).map(escapeRegex).join('|');
  if (!pattern) return 0;
  const columns = await sql<{ table_name: string; column_name: string; data_type: string; udt_name: string }>`
    select c.table_name, c.column_name, c.data_type, c.udt_name
    from information_schema.columns c
    join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name and t.table_type = 'BASE TABLE'
    where c.table_schema = 'public' and c.table_name <> 'users'
      and exists (select 1 from information_schema.columns s
                  where s.table_schema = 'public' and s.table_name = c.table_name and s.column_name = 'space_id')`.execute(trx);
  let changed = 0;
  for (const c of columns.rows) {
    const type = c.data_type === 'USER-DEFINED' ? c.udt_name : c.data_type;
    if (!TEXT_TYPES.has(type) || c.column_name === 'space_id') continue;
    const col = sql.ref(c.column_name);
    const replaced =
      type === 'jsonb' || type === 'json'
        ? sql`regexp_replace(${col}::text, ${pattern}, ${placeholder}, 'gi')::${sql.raw(type)}`
        : sql`regexp_replace(${col}::text, ${pattern}, ${placeholder}, 'gi')`;
    const r = await sql`update ${sql.table(c.table_name)} set ${col} = ${replaced}
                        where space_id = ${spaceId} and ${col}::text ~* ${pattern}`.execute(trx);
    changed += Number(r.numAffectedRows ?? 0);
  }
  return changed;
}

export async function erasePerson(db: Db, ctx: Ctx, userId: string, input: EraseInput): Promise<{ id: string; name: string }> {
  return db.transaction().execute(async (trx) => {
    const person = await scoped(trx, ctx)
      .selectFrom('users')
      .innerJoin('memberships', 'memberships.user_id', 'users.id')
      .select(['users.id', 'users.name', 'users.email', 'users.erased_at'])
      .where('memberships.space_id', '=', ctx.spaceId)
      .where('users.id', '=', userId)
      .forUpdate()
      .executeTakeFirst();
    if (!person) throw new NotFoundError('No such person in this space.');
    if (person.erased_at) throw new ConflictError('This person has been erased already.');
    if (person.id === ctx.userId) throw new ConflictError('You cannot erase yourself here; ask another admin.');
    if (input.confirmEmail.trim().toLowerCase() !== person.email.toLowerCase())
      throw new InvalidError('Type the person’s e-mail address to confirm.', { confirmEmail: ['does not match this person’s e-mail address'] });
    const elsewhere = await scoped(trx, ctx).selectFrom('memberships').select('space_id').where('user_id', '=', userId).where('space_id', '<>', ctx.spaceId).executeTakeFirst();
    if (elsewhere) throw new ConflictError('This person is also a member of another space: its admins must agree, so an operator erases them.');
    const out = await scoped(trx, ctx).selectFrom('loans').select('id').where('borrower_id', '=', userId).where('status', '=', 'out').executeTakeFirst();
    if (out) throw new ConflictError('This person still has a loan out: take it back (or write it off) first.');
    const pending = await scoped(trx, ctx).selectFrom('sales').select('id').where('buyer_id', '=', userId).where('status', '=', 'pending').executeTakeFirst();
    if (pending) throw new ConflictError('This person has a card sale still pending: let it end first.');

    const placeholder = `Erased person ${userId.slice(0, 8)}`;
    await scrubSpaceText(trx, ctx.spaceId, [person.email, person.name], placeholder);
    const at = new Date();
    await trx
      .updateTable('users')
      .set({ name: placeholder, email: `erased-${userId}@erased.invalid`, password_hash: null, calendar_token: null, disabled_at: at, erased_at: at })
      .where('id', '=', userId)
      .execute();
    await scoped(trx, ctx).updateTable('memberships').set({ disabled_at: at }).where('user_id', '=', userId).execute();
    await trx.deleteFrom('auth_sessions').where('user_id', '=', userId).execute();
    await trx.deleteFrom('sign_in_tokens').where('user_id', '=', userId).execute();
    await scoped(trx, ctx).updateTable('holds').set({ status: 'cancelled' }).where('user_id', '=', userId).where('status', 'in', ['waiting', 'ready']).execute();
    // No name or address in the audit row: only that it happened, and to which placeholder.
    await audit(trx, { spaceId: ctx.spaceId, actorId: ctx.userId, action: 'person.erased', targetType: 'person', targetId: userId });
    return { id: userId, name: placeholder };
  });
}
