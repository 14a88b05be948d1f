import { randomUUID } from 'node:crypto';
import { createDb, type Db } from '@/db/connect';
import type { PartCategory, Role } from '@/db/types';
import { newCode } from '@/labels/code';
import { hashPassword } from '@/lib/auth/password';

// Integration tests use the real PostgreSQL of the test run. Each test file makes its own space
// (tenancy keeps files apart), so no test depends on another's rows.
let shared: Db | undefined;
export function testDb(): Db {
  return (shared ??= createDb(process.env.DATABASE_URL!, 20));
}
export async function closeTestDb(): Promise<void> {
  await shared?.destroy();
  shared = undefined;
}

export const uniq = (prefix: string) => `${prefix}-${randomUUID().slice(0, 8)}`;
export const TEST_PASSWORD = 'test-password-1234';
let cachedHash: string | undefined;

export async function makeSpace(db: Db, over: Partial<{ name: string; currency: string; timeZone: string }> = {}) {
  const slug = uniq('space');
  return db
    .insertInto('spaces')
    .values({ slug, name: over.name ?? `Test space ${slug}`, currency: over.currency ?? 'USD', time_zone: over.timeZone ?? 'UTC' })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function makeUser(db: Db, spaceId: string, roles: Role[], name = 'Test person') {
  const email = `${uniq('person')}@tests.example`;
  cachedHash ??= await hashPassword(TEST_PASSWORD);
  const user = await db
    .insertInto('users')
    .values({ email, name, password_hash: cachedHash, last_space_id: spaceId })
    .returningAll()
    .executeTakeFirstOrThrow();
  await db.insertInto('memberships').values({ space_id: spaceId, user_id: user.id, roles }).execute();
  return { ...user, password: TEST_PASSWORD };
}

export async function makeCode(db: Db, spaceId: string, kind: 'unit' | 'part' | 'location' | 'kit_box', targetId: string) {
  const code = newCode();
  await db.insertInto('label_codes').values({ code, space_id: spaceId, kind, target_id: targetId }).execute();
  return code;
}

export async function makeLocation(db: Db, spaceId: string, name = uniq('Bin')) {
  const id = randomUUID();
  const code = await makeCode(db, spaceId, 'location', id);
  return db.insertInto('locations').values({ id, space_id: spaceId, name, code }).returningAll().executeTakeFirstOrThrow();
}

export async function makePart(
  db: Db,
  spaceId: string,
  over: Partial<{ name: string; category: PartCategory; tracking: 'counted' | 'unit'; specs: Record<string, unknown>; priceMinor: number; sellable: boolean; reorderPoint: number }> = {},
) {
  const id = randomUUID();
  const code = await makeCode(db, spaceId, 'part', id);
  return db
    .insertInto('parts')
    .values({
      id,
      space_id: spaceId,
      sku: uniq('SKU'),
      name: over.name ?? 'Test part',
      category: over.category ?? 'consumable',
      tracking: over.tracking ?? 'counted',
      specs: JSON.stringify(over.specs ?? {}),
      price_minor: over.priceMinor ?? null,
      sellable: over.sellable ?? over.priceMinor !== undefined,
      reorder_point: over.reorderPoint ?? 0,
      code,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function makeStock(db: Db, spaceId: string, partId: string, locationId: string, qty: number) {
  await db.insertInto('stock').values({ space_id: spaceId, part_id: partId, location_id: locationId, qty }).execute();
}

export async function makeUnit(db: Db, spaceId: string, partId: string, locationId: string | null = null) {
  const id = randomUUID();
  const code = await makeCode(db, spaceId, 'unit', id);
  return db.insertInto('units').values({ id, space_id: spaceId, part_id: partId, code, location_id: locationId }).returningAll().executeTakeFirstOrThrow();
}
