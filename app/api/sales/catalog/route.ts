import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { sellableCatalog } from '@/lib/sales/catalog';
import { spaceClock } from '@/lib/sales/periods';

export const dynamic = 'force-dynamic';

// GET: what the counter sells, with prices and what is on the shelf now.
export const GET = handle(async () => {
  const ctx = await requireRole('member', 'steward');
  const { currency } = await spaceClock(db, ctx.spaceId);
  return NextResponse.json({ currency, items: await sellableCatalog(db, ctx.spaceId) });
});
