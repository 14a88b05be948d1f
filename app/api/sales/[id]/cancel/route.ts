import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { cancelCardSale } from '@/lib/sales/card';
import { saleIdParam } from '@/lib/sales/params';
import { processorError } from '@/lib/sales/processor-errors';

// POST: the buyer turned back on the pay page; end the sale now rather than at the session's expiry.
export const POST = handle(async (_req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireRole('member', 'steward');
  const id = await saleIdParam(params);
  const settled = await cancelCardSale(db, ctx, id, paymentsClient(ctx.spaceId)).catch((err: unknown) => {
    throw processorError(err, 'cancel the card payment');
  });
  if (settled.receipt) await sendReceipts(db, [id]);
  return NextResponse.json({ sale: { id, status: settled.status } });
});
