import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { settingsPatchSchema } from '@/lib/settings/schema';
import { getSettings, updateSettings } from '@/lib/settings/settings';

/** The rules of the admin's current space. */
export const GET = handle(async () => {
  const ctx = await requireRole('admin');
  return NextResponse.json({ settings: await getSettings(db, ctx) });
});

/** Changes any subset of the rules; each field is validated and named on error. */
export const PATCH = handle(async (req: Request) => {
  const ctx = await requireRole('admin');
  const patch = await parseJsonBody(req, settingsPatchSchema);
  return NextResponse.json({ settings: await updateSettings(db, ctx, patch) });
});
