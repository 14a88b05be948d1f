import { sql, type Kysely } from 'kysely';

// The gate over a member's whole build and the heat in a kit box: the space's ambient temperature
// (the check's starting point for every junction temperature), and the parts a borrower described as
// their own on a loan, so that later borrows check against them too.

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .alterTable('spaces')
    .addColumn('ambient_c', 'double precision', (c) => c.notNull().defaultTo(25))
    .execute();
  // The check accepts −20…60 °C; the database keeps the same bounds so no other writer can go past them.
  await sql`alter table spaces add constraint spaces_ambient_c_range check (ambient_c between -20 and 60)`.execute(db);
  await db.schema.alterTable('loans').addColumn('own_parts', 'jsonb').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('loans').dropColumn('own_parts').execute();
  await sql`alter table spaces drop constraint if exists spaces_ambient_c_range`.execute(db);
  await db.schema.alterTable('spaces').dropColumn('ambient_c').execute();
}
