// `npm run bench -- --large`: adds the large shape (bench/large-shape.ts: 50 more spaces × 10,000 parts
// and 1,000,000 past loans) to the bench database beside the bench shelf, then ANALYZE.
//   DATABASE_URL=… npx tsx bench/large.ts
import { createDb } from '@/db/connect';
import { hashPassword } from '@/lib/auth/password';
import { generateLargeShape, LARGE } from './large-shape';

async function main() {
  const db = createDb(process.env.DATABASE_URL!, 2);
  const t = Date.now();
  try {
    await generateLargeShape(db, LARGE, await hashPassword('large-shape-not-used-for-sign-in'), (line) => console.log(`  ${line}`));
    console.log(`large shape: ${LARGE.spaces} spaces × ${LARGE.partsPerSpace.toLocaleString('en')} parts, ${LARGE.pastLoans.toLocaleString('en')} past loans in ${((Date.now() - t) / 1000).toFixed(0)} s`);
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error('large shape failed:', err);
  process.exit(1);
});
