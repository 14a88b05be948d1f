import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { saleIdParam } from '@/lib/sales/params';
import { saleView } from '@/lib/sales/read';

export const dynamic = 'force-dynamic';

// GET: one sale (the counter's status page polls this). Reading changes nothing: asking the processor
// about a sale past its expiry is POST …/settle, the Books sweep, or the processor's own expiry event.
export const GET = handle(async (_req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireUser();
  const id = await saleIdParam(params);
  return NextResponse.json({ sale: await saleView(db, ctx, id) });
});
