import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { encodeCode } from '@/labels/code';
import { resolveCode } from '@/lib/inventory/resolve';
import { closeTestDb, makeSpace, testDb } from '../helpers/db';

// The scan lookup is built once per process and sent as a named statement (db/built-once.ts, db/connect.ts):
// on the real PostgreSQL, each connection prepares it once, and two spaces' scans of codes that exist only
// in one of them still see only their own.

const db = testDb();
let spaces: { id: string }[];
let codes: string[];

beforeAll(async () => {
  spaces = [await makeSpace(db), await makeSpace(db)];
  codes = [];
  for (const [i, space] of spaces.entries()) {
    const location = await db
      .insertInto('locations')
      .values({ space_id: space.id, name: `Bin ${i}` })
      .returning('id')
      .executeTakeFirstOrThrow();
    // A code with a valid check symbol, made by the app's own encoder.
    const code = encodeCode(900_000_000 + i * 17 + Math.floor(Math.random() * 1000));
    await db.insertInto('label_codes').values({ space_id: space.id, code, kind: 'location', target_id: location.id }).execute();
    codes.push(code);
  }
});

afterAll(closeTestDb);

describe('the scan lookup as a prepared statement', () => {
  test('one connection: prepared on first use, then reused; each space sees only its own label', async () => {
    await db.transaction().execute(async (trx) => {
      const first = await resolveCode(trx, { spaceId: spaces[0].id }, codes[0]);
      expect(first).toMatchObject({ code: codes[0], kind: 'location', name: 'Bin 0' });
      const second = await resolveCode(trx, { spaceId: spaces[1].id }, codes[1]);
      expect(second).toMatchObject({ code: codes[1], kind: 'location', name: 'Bin 1' });
      // The other space's code, on the same prepared statement: not found.
      await expect(resolveCode(trx, { spaceId: spaces[0].id }, codes[1])).rejects.toThrow(/No label/);
      const prepared = await sql<{ name: string }>`select name from pg_prepared_statements where name like 'ohm_label_with_target_%'`.execute(trx);
      expect(prepared.rows).toHaveLength(1);
    });
  });
});
