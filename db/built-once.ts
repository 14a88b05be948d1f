import {
  CompiledQuery,
  DummyDriver,
  Kysely,
  PostgresAdapter,
  PostgresIntrospector,
  PostgresQueryCompiler,
  type Compilable,
} from 'kysely';
import { createHash } from 'node:crypto';
import type { Database } from './types';

// Statements on the hottest paths (every signed-in request's caller lookup, every scan) are built with
// Kysely's query builder once per process instead of once per request: Kysely's immutable node trees and
// the space-scope plugin's rewrite cost more CPU than the database's own work for a one-row lookup
// (bench/profile.ts). The statement is built against a builder that cannot run anything, with markers in
// place of the values; its SQL text and the positions of the markers are kept; every call sends that text
// with the call's values. The text is also given a name, so each pooled connection parses and plans it
// once (a prepared statement: db/connect.ts names it when it is sent).
//
// `build` gets markers, not values: it must use its arguments only as values in the query (never in
// branches, lengths or SQL text) and read nothing else that changes between calls. Both are checked on
// the first call: every marker must arrive as a parameter, none may land in the SQL text, and any other
// parameter (a constant such as kind = 'unit') must be a plain string, number or boolean.

/** A builder for compiling only: it has no connection and throws if asked to run anything. */
export const compileOnly = new Kysely<Database>({
  dialect: {
    createAdapter: () => new PostgresAdapter(),
    createDriver: () => new DummyDriver(),
    createIntrospector: (db) => new PostgresIntrospector(db),
    createQueryCompiler: () => new PostgresQueryCompiler(),
  },
});

/** SQL text → prepared statement name, for db/connect.ts. */
const named = new Map<string, string>();
export const preparedNameOf = (sqlText: string): string | undefined => named.get(sqlText);

type Runner = { executeQuery: Kysely<Database>['executeQuery'] };
const mark = (i: number) => `\u0000ohm-value-${i}\u0000`;

export class BuiltOnceError extends Error {}

export function builtOnce<V extends unknown[], R>(name: string, build: (db: Kysely<Database>, ...values: V) => Compilable<R>) {
  let made: { sql: string; from: (number | { constant: unknown })[] } | undefined;

  const make = (count: number) => {
    // Markers are strings whatever the values' types: the builder only passes them on as parameters.
    const marks = Array.from({ length: count }, (_, i) => mark(i)) as unknown as V;
    const compiled = build(compileOnly, ...marks).compile();
    if (compiled.sql.includes('\u0000')) throw new BuiltOnceError(`${name}: a value reached the SQL text instead of a parameter`);
    const from = compiled.parameters.map((p) => {
      const at = (marks as unknown[]).indexOf(p);
      if (at >= 0) return at;
      if (!['string', 'number', 'boolean'].includes(typeof p))
        throw new BuiltOnceError(`${name}: parameter ${String(p)} is neither a marker nor a plain constant`);
      return { constant: p };
    });
    const unused = (marks as unknown[]).findIndex((m) => !compiled.parameters.includes(m));
    if (unused >= 0) throw new BuiltOnceError(`${name}: value ${unused + 1} does not reach the query as a parameter`);
    const hash = createHash('sha256').update(compiled.sql).digest('hex').slice(0, 12);
    named.set(compiled.sql, `ohm_${name}_${hash}`);
    return { sql: compiled.sql, from };
  };

  /** Runs the statement on `db` (a handle or a transaction) with these values; answers its rows. */
  return async (db: Runner, ...values: V): Promise<R[]> => {
    made ??= make(values.length);
    const parameters = made.from.map((f) => (typeof f === 'number' ? values[f] : f.constant));
    const result = await db.executeQuery<R>(CompiledQuery.raw(made.sql, parameters));
    return result.rows;
  };
}
