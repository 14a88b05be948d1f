import { createDb } from '../db/connect';
import { seedDemo } from '../db/seed/demo';
import { seedSales } from '../db/seed/sales';

async function main() {
  const db = createDb(process.env.DATABASE_URL!, 2);
  try {
    const { seeded } = await seedDemo(db);
    console.log(seeded ? 'demo data seeded' : 'demo data already present: left as it is');
    // A month of card and cash sales, both in our database and at the payments fake (skipped with a note
    // when the fake is down or the sales exist already).
    const sales = await seedSales(db);
    console.log(sales.note);
  } finally {
    await db.destroy();
  }
}
main().catch((err) => {
  console.error('seed failed:', err);
  process.exit(1);
});
