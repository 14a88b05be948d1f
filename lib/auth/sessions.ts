import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';

// Server-side sessions. The session cookie (a next-auth JWT) carries the id of a row here; the guard
// honours a cookie only while its row is open, in the same single query that loads the person. Signing
// out ends the row, so a copied or saved cookie stops working at once instead of living out its 12 hours.

export const SESSION_HOURS = 12;
export const SESSION_SECONDS = SESSION_HOURS * 60 * 60;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isSessionId = (v: unknown): v is string => typeof v === 'string' && UUID.test(v);

/** Opens a session at sign-in and returns its id; the person's long-dead rows are cleared on the way. */
export async function openSession(db: Db, userId: string): Promise<string> {
  return db.transaction().execute(async (trx) => {
    await trx
      .deleteFrom('auth_sessions')
      .where('user_id', '=', userId)
      .where(sql<boolean>`coalesce(ended_at, expires_at) < now() - interval '1 day'`)
      .execute();
    const row = await trx
      .insertInto('auth_sessions')
      .values({ user_id: userId, expires_at: sql<Date>`now() + make_interval(hours => ${SESSION_HOURS})` as never })
      .returning('id')
      .executeTakeFirstOrThrow();
    return row.id;
  });
}

/** Whether the session is still open (next-auth's own /api/auth/session asks this). */
export async function isSessionOpen(db: Db, sessionId: unknown, userId: unknown): Promise<boolean> {
  if (!isSessionId(sessionId) || typeof userId !== 'string') return false;
  const row = await db
    .selectFrom('auth_sessions')
    .select('id')
    .where('id', '=', sessionId)
    .where('user_id', '=', userId)
    .where('ended_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst();
  return Boolean(row);
}

/** Sign-out: ends this one session (the person's other devices stay signed in). */
export async function endSession(db: Db, sessionId: unknown): Promise<void> {
  if (!isSessionId(sessionId)) return;
  await db
    .updateTable('auth_sessions')
    .set({ ended_at: sql<Date>`now()` as never })
    .where('id', '=', sessionId)
    .where('ended_at', 'is', null)
    .execute();
}

/** Ends every open session of a person (a new password: whoever held the old one is out). */
export async function endAllSessions(db: Db, userId: string): Promise<number> {
  const rows = await db
    .updateTable('auth_sessions')
    .set({ ended_at: sql<Date>`now()` as never })
    .where('user_id', '=', userId)
    .where('ended_at', 'is', null)
    .returning('id')
    .execute();
  return rows.length;
}
