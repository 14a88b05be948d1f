import { type Kysely } from 'kysely';

// Box upkeep: the note a steward writes when checking a loan back in (what was missing or damaged, in
// their own words), kept on the loan so Today and Repairs can say why a box is out of service.

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .alterTable('loans')
    .addColumn('return_note', 'text', (c) => c.notNull().defaultTo(''))
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('loans').dropColumn('return_note').execute();
}
