import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { paymentsClient } from '@/lib/payments/client';
import { saleIdParam } from '@/lib/sales/params';
import { refundSale } from '@/lib/sales/refunds';
import { refundInput } from '@/lib/sales/schemas';

// POST: a refund by the treasurer, full (no lines) or per line, optionally restocking.
export const POST = handle(async (req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireRole('treasurer');
  const id = await saleIdParam(params);
  const input = await parseJsonBody(req, refundInput);
  const refund = await refundSale(db, ctx, id, input, paymentsClient(ctx.spaceId));
  return NextResponse.json({ refund }, { status: 201 });
});
