import 'server-only';
import type { Transaction } from 'kysely';
import type { Db } from '@/db/connect';
import type { Database } from '@/db/types';
import { ConflictError } from '@/lib/errors';

// Deadlock (40P01) and serialization failure (40001) mean "another change got there first": the
// whole transaction is safe to run again. Anything else is passed on.
const RETRYABLE = new Set(['40P01', '40001']);
const ATTEMPTS = 4;

/**
 * Runs `fn` in one transaction, or inside the caller's when `db` already is one (so services
 * compose into a larger transaction). A deadlock or serialization failure is retried a few times.
 */
export async function inTransaction<T>(db: Db, fn: (trx: Transaction<Database>) => Promise<T>): Promise<T> {
  if (db.isTransaction) return fn(db as Transaction<Database>);
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction().execute(fn);
    } catch (err) {
      const code = (err as { code?: string }).code;
      if (!code || !RETRYABLE.has(code)) throw err;
      if (attempt >= ATTEMPTS) throw new ConflictError('The shelf was busy with other changes; try again.');
      await new Promise((r) => setTimeout(r, 5 * attempt + Math.random() * 10));
    }
  }
}

/** PostgreSQL unique violation on a named constraint. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string };
  return e?.code === '23505' && (!constraint || e.constraint === constraint);
}
