import { FileMigrationProvider, Migrator, type Kysely } from 'kysely';
import { promises as fs } from 'node:fs';
import path from 'node:path';

/** Kysely's Migrator over db/migrations/NNNN_name.ts. */
export function migrator(db: Kysely<unknown>): Migrator {
  return new Migrator({
    db,
    provider: new FileMigrationProvider({ fs, path, migrationFolder: path.join(__dirname, 'migrations') }),
  });
}

export async function migrateToLatest(db: Kysely<unknown>): Promise<string[]> {
  const { error, results } = await migrator(db).migrateToLatest();
  if (error) throw error;
  return (results ?? []).map((r) => `${r.migrationName}: ${r.status}`);
}

export async function migrateDownAll(db: Kysely<unknown>): Promise<string[]> {
  const m = migrator(db);
  const done: string[] = [];
  for (;;) {
    const { error, results } = await m.migrateDown();
    if (error) throw error;
    if (!results?.length) break;
    done.push(...results.map((r) => `${r.migrationName}: ${r.status}`));
  }
  return done;
}

/** Up or down to the named migration (it stays applied), e.g. for the test of a migration on old data. */
export async function migrateTo(db: Kysely<unknown>, name: string): Promise<string[]> {
  const { error, results } = await migrator(db).migrateTo(name);
  if (error) throw error;
  return (results ?? []).map((r) => `${r.migrationName}: ${r.status}`);
}
