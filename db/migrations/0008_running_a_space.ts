import { sql, type Kysely } from 'kysely';

// Running it for a real space.
// users.erased_at: when a person's personal data was erased on request (lib/people/erase.ts); their row
// stays as an anonymous placeholder so loans, sales and the audit keep pointing at someone.
// backup_runs: every nightly backup attempt (lib/backup/run.ts), for Settings and for the failure mail.
// It belongs to the installation, not to a space (one database, one dump), so it has no space_id.

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('users').addColumn('erased_at', 'timestamptz').execute();
  await db.schema
    .createTable('backup_runs')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('taken_at', 'timestamptz', (c) => c.notNull())
    .addColumn('started_at', 'timestamptz', (c) => c.notNull())
    .addColumn('finished_at', 'timestamptz', (c) => c.notNull())
    .addColumn('file', 'text')
    .addColumn('size_bytes', 'bigint')
    .addColumn('ok', 'boolean', (c) => c.notNull())
    .addColumn('error', 'text')
    .addCheckConstraint('backup_runs_ok_has_file', sql`(ok and file is not null and size_bytes is not null) or (not ok and error is not null)`)
    .execute();
  await db.schema.createIndex('backup_runs_finished_idx').on('backup_runs').column('finished_at').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('backup_runs').ifExists().execute();
  await db.schema.alterTable('users').dropColumn('erased_at').execute();
}
