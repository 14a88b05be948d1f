import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle } from '@/lib/http/respond';
import { shelfReader } from '@/lib/inventory/access';
import { listRepairs } from '@/lib/inventory/units';

export const GET = handle(async () => {
  const ctx = await shelfReader();
  return NextResponse.json({ units: await listRepairs(db, ctx) });
});
