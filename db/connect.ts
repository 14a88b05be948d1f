import { Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import { preparedNameOf } from './built-once';
import type { Database } from './types';

// bigint (count(*), bigserial) as number: our counts stay far below 2^53.
pg.types.setTypeParser(20, (v) => Number(v));
// numeric as number: the quantities of counted stock (numeric(12,3), migration 0014) have at most three
// decimals and twelve digits, well inside a double's exact range, so every stored value reads back as the
// same JavaScript number (65.5 stays 65.5). Set once here so every query, sum() included, gets numbers.
pg.types.setTypeParser(1700, (v) => Number(v));
// date columns stay 'YYYY-MM-DD' strings: no time-zone shift.
pg.types.setTypeParser(1082, (v) => v);

/** A Kysely handle on its own pool; used by the app (db/index.ts), scripts and tests. */
export function createDb(connectionString: string, max = 10): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString,
    max,
    connectionTimeoutMillis: 3_000,
    idleTimeoutMillis: 30_000,
  });
  // An idle client losing its server (PostgreSQL restart) must not crash the process.
  pool.on('error', (err) => console.error('[db] idle client error:', err.message));
  // A checked-out client whose server goes away emits 'error' itself; without a listener that would be an
  // uncaught exception. The query in flight still fails and the request answers 503.
  pool.on('connect', (client) => {
    client.on('error', (err) => console.error('[db] client error:', err.message));
    nameBuiltOnceStatements(client);
  });
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

export type Db = Kysely<Database>;

/**
 * Sends the statements of db/built-once.ts under their names, so this connection parses and plans each
 * once (node-postgres prepares a named query on first use per connection). Kysely calls
 * `client.query(text, values)`; every other statement passes through unchanged.
 */
function nameBuiltOnceStatements(client: pg.PoolClient): void {
  const query = client.query.bind(client) as (...args: unknown[]) => unknown;
  (client as unknown as { query: (...args: unknown[]) => unknown }).query = (...args: unknown[]) => {
    const [text, values] = args;
    const name = typeof text === 'string' && Array.isArray(values) ? preparedNameOf(text) : undefined;
    return name ? query({ name, text, values }) : query(...args);
  };
}
