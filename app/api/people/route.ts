import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { listPeople } from '@/lib/people/people';

/** The people of the admin's current space. */
export const GET = handle(async () => {
  const ctx = await requireRole('admin');
  return NextResponse.json({ people: await listPeople(db, ctx) });
});
