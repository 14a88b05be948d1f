import { createDb } from '../db/connect';
import { seedDemo } from '../db/seed/demo';

async function main() {
  const db = createDb(process.env.DATABASE_URL!, 2);
  try {
    const { seeded } = await seedDemo(db);
    console.log(seeded ? 'demo data seeded' : 'demo data already present: left as it is');
  } finally {
    await db.destroy();
  }
}
main().catch((err) => {
  console.error('seed failed:', err);
  process.exit(1);
});
