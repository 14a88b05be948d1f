import { NextResponse } from 'next/server';
import { requireUser } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { checkSaleNow } from '@/lib/sales/check';
import { saleIdParam } from '@/lib/sales/params';

// POST: ask the processor about a pending card sale now ("check again" on the status page).
export const POST = handle(async (_req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireUser();
  const id = await saleIdParam(params);
  return NextResponse.json({ sale: await checkSaleNow(ctx, id) });
});
