'use server';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { db } from '@/db';
import { formAction } from '@/lib/auth/action';
import { SPACE_COOKIE } from '@/lib/auth/guard';
import { idSchema } from '@/lib/ids';
import { rememberCurrentSpace } from '@/lib/people/current-space';

const toToday = (): never => redirect('/today');

/** Switches the current space; only to a space the person belongs to (anything else: back to Today). */
export const switchSpace = formAction('signed-in', z.object({ spaceId: idSchema }), async (ctx, { spaceId }) => {
  if (!ctx.spaces.some((s) => s.id === spaceId)) toToday();
  await rememberCurrentSpace(db, ctx, spaceId);
  (await cookies()).set(SPACE_COOKIE, spaceId, { httpOnly: true, sameSite: 'lax', path: '/', maxAge: 60 * 60 * 24 * 365 });
  toToday();
}, toToday);
