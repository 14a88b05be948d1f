import 'server-only';
import { cache } from 'react';
import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { getServerSession } from 'next-auth';
import { db } from '@/db';
import type { Role } from '@/db/types';
import { ForbiddenError, UnauthenticatedError } from '@/lib/errors';
import { authOptions } from './options';
import type { Ctx } from './roles';

export const SPACE_COOKIE = 'ohm_space';

/** The signed-in person in their current space, or null. Cached per request. */
export const currentCtx = cache(async (): Promise<Ctx | null> => {
  const session = await getServerSession(authOptions);
  const userId = (session?.user as { id?: string } | undefined)?.id;
  if (!userId) return null;
  const user = await db
    .selectFrom('users')
    .select(['id', 'email', 'name', 'disabled_at', 'last_space_id'])
    .where('id', '=', userId)
    .executeTakeFirst();
  if (!user || user.disabled_at) return null;
  const spaces = await db
    .selectFrom('memberships')
    .innerJoin('spaces', 'spaces.id', 'memberships.space_id')
    .select(['spaces.id', 'spaces.name', 'memberships.roles'])
    .where('memberships.user_id', '=', userId)
    .orderBy('spaces.name')
    .execute();
  if (!spaces.length) return null;
  const wanted = (await cookies()).get(SPACE_COOKIE)?.value ?? user.last_space_id;
  const current = spaces.find((s) => s.id === wanted) ?? spaces[0];
  return {
    userId: user.id,
    email: user.email,
    name: user.name,
    spaceId: current.id,
    spaceName: current.name,
    roles: current.roles,
    spaces: spaces.map((s) => ({ id: s.id, name: s.name, roles: s.roles })),
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
