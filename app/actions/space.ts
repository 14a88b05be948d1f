'use server';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { db } from '@/db';
import { requireUser, SPACE_COOKIE } from '@/lib/auth/guard';

/** Switches the current space; only to a space the person belongs to. */
export async function switchSpace(form: FormData): Promise<void> {
  const ctx = await requireUser();
  const spaceId = z.string().uuid().safeParse(form.get('spaceId'));
  if (!spaceId.success || !ctx.spaces.some((s) => s.id === spaceId.data)) redirect('/today');
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('users').set({ last_space_id: spaceId.data }).where('id', '=', ctx.userId).execute();
  });
  (await cookies()).set(SPACE_COOKIE, spaceId.data, { httpOnly: true, sameSite: 'lax', path: '/', maxAge: 60 * 60 * 24 * 365 });
  redirect('/today');
}
