import { describe, expect, test, vi } from 'vitest';
import { CompiledQuery, sql, type Kysely } from 'kysely';
import type { Database } from '@/db/types';
import { builtOnce, BuiltOnceError, preparedNameOf } from '@/db/built-once';
import { scoped } from '@/db/scoped';

// db/built-once.ts: a statement built once, sent again with each call's values. What it must never do is
// send one call's value with another call — a wrong space or a wrong person would be a leak.

/** Records what would be sent to the database and answers one row. */
function recorder() {
  const sent: CompiledQuery[] = [];
  return {
    sent,
    runner: {
      executeQuery: (async (q: CompiledQuery) => {
        sent.push(q);
        return { rows: [{ ok: true }] };
      }) as never,
    },
  };
}

const A = '11111111-1111-4111-8111-111111111111';
const B = '22222222-2222-4222-8222-222222222222';

describe('builtOnce', () => {
  test('builds on the first call only, and every call sends its own values in their places', async () => {
    const build = vi.fn((db: Kysely<Database>, spaceId: string, code: string) =>
      scoped(db, { spaceId })
        .selectFrom('label_codes as lc')
        .leftJoin('parts as p', (j) => j.onRef('p.id', '=', 'lc.target_id').on('lc.kind', '=', 'part'))
        .select(['lc.code', 'p.name'])
        .where('lc.code', '=', code),
    );
    const run = builtOnce('test_labels', build);
    const { sent, runner } = recorder();
    await run(runner, A, 'CODE1');
    await run(runner, B, 'CODE2');
    expect(build).toHaveBeenCalledTimes(1);
    expect(sent[0].sql).toBe(sent[1].sql);
    // The scope plugin's conditions carry the space (label_codes and the joined parts), the constant stays.
    expect(sent[0].sql).toContain('"lc"."space_id" = $');
    expect(sent[0].sql).toContain('"p"."space_id" = $');
    expect(sent[0].parameters).toContain('part');
    expect(sent[0].parameters.filter((p) => p === A)).toHaveLength(2);
    expect(sent[0].parameters).toContain('CODE1');
    expect(sent[1].parameters.filter((p) => p === B)).toHaveLength(2);
    expect(sent[1].parameters).toContain('CODE2');
    expect(sent[1].parameters).not.toContain(A);
    expect(sent[1].parameters).not.toContain('CODE1');
    // Sent under a name, so PostgreSQL plans it once per connection.
    expect(preparedNameOf(sent[0].sql)).toMatch(/^ohm_test_labels_[0-9a-f]{12}$/);
  });

  test('an array value travels as one parameter (col = any($n)), whatever its length', async () => {
    const run = builtOnce('test_any', (db, spaceId: string, categories: string[]) =>
      scoped(db, { spaceId })
        .selectFrom('category_inductions as c')
        .select('c.induction_id')
        .where('c.category', '=', sql<'led'>`any(${categories})`),
    );
    const { sent, runner } = recorder();
    await run(runner, A, ['led', 'driver']);
    await run(runner, A, ['supply']);
    expect(sent[0].sql).toBe(sent[1].sql);
    expect(sent[0].sql).toContain('= any($1)');
    expect(sent[0].parameters).toEqual([['led', 'driver'], A]);
    expect(sent[1].parameters).toEqual([['supply'], A]);
  });

  test('a value that would become SQL text is refused', async () => {
    const run = builtOnce('test_raw', (db, table: string) => db.selectFrom('parts').select(sql.raw<string>(table).as('x')));
    await expect(run(recorder().runner, 'name')).rejects.toThrow(BuiltOnceError);
  });

  test('a value the query does not use is refused (it would be silently ignored)', async () => {
    const run = builtOnce('test_unused', (db, _code: string) => db.selectFrom('parts').select('id'));
    await expect(run(recorder().runner, 'x')).rejects.toThrow(/does not reach the query/);
  });

  test('a changing constant (a Date read while building) is refused: it would be frozen at its first value', async () => {
    const run = builtOnce('test_date', (db, id: string) =>
      db.selectFrom('loans').select('id').where('id', '=', id).where('due_at', '<', new Date()),
    );
    await expect(run(recorder().runner, 'x')).rejects.toThrow(/neither a marker nor a plain constant/);
  });

  test('statements that are not built once are not named', () => {
    expect(preparedNameOf('select 1')).toBeUndefined();
  });
});
