import { sql, type Kysely } from 'kysely';

// Sessions that can be ended on the server, and access that is switched off per space.
//
// auth_sessions: one row per sign-in; the session cookie carries its id. Signing out ends the row, and
// the guard only honours a cookie whose row is still open, so a copied cookie dies with its session.
//
// memberships.disabled_at: an admin of a space ends a person's access to that space only. The
// account-wide users.disabled_at stays for an operator (e.g. a compromised account) but no screen sets it;
// whatever it held moves to the person's memberships here.

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('auth_sessions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('ended_at', 'timestamptz')
    .execute();
  // "End every open session of this person" (password change) and the clean-up at sign-in.
  await sql`create index auth_sessions_user_open_idx on auth_sessions (user_id) where ended_at is null`.execute(db);

  await db.schema.alterTable('memberships').addColumn('disabled_at', 'timestamptz').execute();
  await sql`update memberships m set disabled_at = u.disabled_at
            from users u where u.id = m.user_id and u.disabled_at is not null`.execute(db);
  await sql`update users set disabled_at = null where disabled_at is not null`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  // Back to one switch per account. It cannot say "off here, on there": an account disabled in any
  // space is disabled everywhere (the cautious reading).
  await sql`update users u set disabled_at = m.first_off
            from (select user_id, min(disabled_at) as first_off from memberships
                  where disabled_at is not null group by user_id) m
            where u.id = m.user_id and u.disabled_at is null`.execute(db);
  await db.schema.alterTable('memberships').dropColumn('disabled_at').execute();
  await db.schema.dropTable('auth_sessions').execute();
}
