import { describe, expect, test } from 'vitest';
import { sql } from 'kysely';
import { compileOnly } from '@/db/built-once';
import { scoped, SpaceScopeError } from '@/db/scoped';

// The SQL scoped() writes, compiled without a database: every space-owned table in a query gets
// `space_id = <the caller's space>`, whatever the query forgot.

// The app's compile-only builder (no connection): the SQL is what the app would send.
const raw = compileOnly;
const SPACE = '11111111-1111-4111-8111-111111111111';
const db = scoped(raw, { spaceId: SPACE });

describe('scoped(): space_id written into every query', () => {
  test('select by id alone gets the space condition', () => {
    const q = db.selectFrom('loans').select('id').where('id', '=', 'x').compile();
    expect(q.sql).toBe('select "id" from "loans" where "id" = $1 and "loans"."space_id" = $2');
    expect(q.parameters).toEqual(['x', SPACE]);
  });

  test('aliases and joins: the alias is scoped, a joined table in its ON (a left join stays a left join)', () => {
    const q = db
      .selectFrom('loan_lines as l')
      .leftJoin('parts as p', 'p.id', 'l.part_id')
      .innerJoin('users as u', 'u.id', 'p.id')
      .select(['l.id', 'p.name'])
      .compile();
    expect(q.sql).toBe(
      'select "l"."id", "p"."name" from "loan_lines" as "l" left join "parts" as "p" on "p"."id" = "l"."part_id" and "p"."space_id" = $1 inner join "users" as "u" on "u"."id" = "p"."id" where "l"."space_id" = $2',
    );
    expect(q.parameters).toEqual([SPACE, SPACE]);
  });

  test('subqueries inside a query are scoped too', () => {
    const q = db
      .selectFrom('kit_boxes as b')
      .select((eb) => eb.selectFrom('loans as l').select('l.due_at').whereRef('l.kit_box_id', '=', 'b.id').as('due'))
      .compile();
    expect(q.sql).toContain('where "l"."kit_box_id" = "b"."id" and "l"."space_id" = $1');
    expect(q.sql).toMatch(/from "kit_boxes" as "b" where "b"."space_id" = \$2$/);
  });

  test('tables a space does not own are left alone', () => {
    const q = db.selectFrom('users').select('id').where('email', '=', 'a@b.example').compile();
    expect(q.sql).toBe('select "id" from "users" where "email" = $1');
  });

  test('update and delete get the condition', () => {
    const u = db.updateTable('units').set({ notes: 'n' }).where('id', '=', 'x').compile();
    expect(u.sql).toBe('update "units" set "notes" = $1 where "id" = $2 and "units"."space_id" = $3');
    const d = db.deleteFrom('kit_box_contents').where('id', '=', 'x').compile();
    expect(d.sql).toBe('delete from "kit_box_contents" where "id" = $1 and "kit_box_contents"."space_id" = $2');
  });

  test('update without a where gets one', () => {
    const u = db.updateTable('holds').set({ status: 'cancelled' }).compile();
    expect(u.sql).toBe('update "holds" set "status" = $1 where "holds"."space_id" = $2');
  });

  test('an insert must carry the caller’s space', () => {
    const ok = db.insertInto('holds').values({ space_id: SPACE, user_id: 'u', unit_id: 'x' }).compile();
    expect(ok.parameters).toContain(SPACE);
    expect(() => db.insertInto('holds').values({ space_id: 'other', user_id: 'u', unit_id: 'x' }).compile()).toThrow(
      SpaceScopeError,
    );
    expect(() =>
      db
        .insertInto('holds')
        .values([
          { space_id: SPACE, user_id: 'u', unit_id: 'x' },
          { space_id: 'other', user_id: 'u', unit_id: 'y' },
        ])
        .compile(),
    ).toThrow(/another space/);
    expect(() =>
      db.insertInto('kit_box_contents').values({ kit_box_id: 'b', part_id: 'p' } as never).compile(),
    ).toThrow(/without space_id/);
  });

  test('the raw handle is untouched (the plugin lives on the scoped copy only)', () => {
    expect(raw.selectFrom('loans').select('id').compile().sql).toBe('select "id" from "loans"');
  });

  test('raw sql fragments are not rewritten (they carry their own space_id; the scan test checks)', () => {
    const q = db.selectFrom('loans').select(sql<number>`1`.as('one')).compile();
    expect(q.sql).toBe('select 1 as "one" from "loans" where "loans"."space_id" = $1');
  });

  test('no space, no handle', () => {
    expect(() => scoped(raw, { spaceId: '' })).toThrow(SpaceScopeError);
  });
});
