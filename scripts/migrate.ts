import { createDb } from '../db/connect';
import { migrateToLatest } from '../db/migrate';

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  const db = createDb(url, 2);
  try {
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
