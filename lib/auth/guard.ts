import 'server-only';
import { cache } from 'react';
import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { sql } from 'kysely';
import { db } from '@/db';
import { builtOnce } from '@/db/built-once';
import type { Role } from '@/db/types';
import { ForbiddenError, UnauthenticatedError } from '@/lib/errors';
import { env } from '@/lib/env';
import type { Ctx } from './roles';
import { decodeSessionToken } from './session-token';
import { isSessionId } from './sessions';

export const SPACE_COOKIE = 'ohm_space';

// next-auth's session cookie (the __Secure- name is used when NEXTAUTH_URL is https).
const SESSION_COOKIES = ['__Secure-next-auth.session-token', 'next-auth.session-token'];

/**
 * The user and session ids in the session cookie. Decoding the signed, encrypted JWT directly costs a
 * fraction of getServerSession, which runs next-auth's whole session endpoint and re-issues the cookie;
 * the decryption key is derived once per process (lib/auth/session-token.ts).
 */
async function sessionClaims(): Promise<{ uid: string; sid: string } | null> {
  const jar = await cookies();
  for (const name of SESSION_COOKIES) {
    const token = jar.get(name)?.value;
    if (!token) continue;
    try {
      const jwt = await decodeSessionToken(token, env().NEXTAUTH_SECRET);
      // A cookie from before server-side sessions (no sid) is nobody: its holder signs in again.
      if (typeof jwt?.uid === 'string' && isSessionId(jwt.sid)) return { uid: jwt.uid, sid: jwt.sid };
    } catch {
      return null; // tampered, expired or signed with another secret
    }
  }
  return null;
}

/**
 * Who holds this open session, with every space where their access is on. Built once per process
 * (db/built-once.ts): it runs on every signed-in request.
 */
// across spaces: who the caller is, with every space where their access is on (the Ctx is made here).
const callerRows = builtOnce('caller', (db, sessionId: string, userId: string) =>
  db
    .selectFrom('users')
    .innerJoin('auth_sessions', (j) =>
      j
        .onRef('auth_sessions.user_id', '=', 'users.id')
        .on('auth_sessions.id', '=', sessionId)
        .on('auth_sessions.ended_at', 'is', null)
        .on('auth_sessions.expires_at', '>', sql<Date>`now()`),
    )
    .innerJoin('memberships', 'memberships.user_id', 'users.id')
    .innerJoin('spaces', 'spaces.id', 'memberships.space_id')
    .select([
      'users.id',
      'users.email',
      'users.name',
      'users.last_space_id',
      'spaces.id as spaceId',
      'spaces.name as spaceName',
      'memberships.roles',
    ])
    .where('users.id', '=', userId)
    .where('users.disabled_at', 'is', null)
    .where('memberships.disabled_at', 'is', null)
    .orderBy('spaces.name'),
);

/** The signed-in person in their current space, or null. Cached per request; one query. */
export const currentCtx = cache(async (): Promise<Ctx | null> => {
  const claims = await sessionClaims();
  if (!claims) return null;
  // Still one query: the session must be open (not signed out, not expired), the account not switched
  // off, and only the spaces where the person's access is on count. None left: nobody.
  const rows = await callerRows(db, claims.sid, claims.uid);
  if (!rows.length) return null;
  const user = rows[0];
  const wanted = (await cookies()).get(SPACE_COOKIE)?.value ?? user.last_space_id;
  const current = rows.find((r) => r.spaceId === wanted) ?? rows[0];
  return {
    userId: user.id,
    email: user.email,
    name: user.name,
    spaceId: current.spaceId,
    spaceName: current.spaceName,
    roles: current.roles,
    spaces: rows.map((r) => ({ id: r.spaceId, name: r.spaceName, roles: r.roles })),
  };
});

/** For route handlers and server actions: 401 when nobody is signed in. */
export async function requireUser(): Promise<Ctx> {
  const ctx = await currentCtx();
  if (!ctx) throw new UnauthenticatedError();
  return ctx;
}

/** 403 unless the person holds one of the roles in their current space. */
export async function requireRole(...roles: Role[]): Promise<Ctx> {
  const ctx = await requireUser();
  if (!roles.some((r) => ctx.roles.includes(r))) throw new ForbiddenError();
  return ctx;
}

/** For pages: anonymous visitors go to sign-in and come back afterwards. */
export async function requirePageUser(): Promise<Ctx> {
  const ctx = await currentCtx();
  if (!ctx) {
    const path = (await headers()).get('x-ohm-path') ?? '/';
    redirect(`/signin?next=${encodeURIComponent(path)}`);
  }
  return ctx;
}

/** For pages: a person without the role sees the forbidden page rather than the data. */
export async function requirePageRole(...roles: Role[]): Promise<Ctx> {
  const ctx = await requirePageUser();
  if (!roles.some((r) => ctx.roles.includes(r))) redirect('/forbidden');
  return ctx;
}
