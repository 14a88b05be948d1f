import { createDb } from '../db/connect';
import { migrateToLatest, migrator } from '../db/migrate';

// `tsx scripts/migrate.ts` migrates to the latest; `--pending` only prints how many migrations are
// waiting (scripts/serve.sh backs up first when that is not 0).
async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  const db = createDb(url, 2);
  try {
    if (process.argv.includes('--pending')) {
      const all = await migrator(db as never).getMigrations();
      console.log(all.filter((m) => !m.executedAt).length);
      return;
    }
    const done = await migrateToLatest(db as never);
    console.log(done.length ? done.join('\n') : 'migrations: already up to date');
  } finally {
    await db.destroy();
  }
}
main().catch((err) => {
  console.error('migration failed:', err);
  process.exit(1);
});
