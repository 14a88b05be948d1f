import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { paymentsDeps } from '@/lib/payments/client';
import { startCardSale } from '@/lib/sales/card';
import { startSaleInput } from '@/lib/sales/schemas';

// POST: a basket paid by card. Answers the processor's pay-page URL for the browser to go to.
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('member', 'steward');
  const input = await parseJsonBody(req, startSaleInput);
  const started = await startCardSale(db, ctx, input, paymentsDeps(ctx.spaceId));
  return NextResponse.json(
    {
      sale: {
        id: started.saleId,
        status: 'pending',
        totalMinor: started.totalMinor,
        currency: started.currency,
        expiresAt: started.expiresAt,
      },
      url: started.url,
    },
    { status: 201 },
  );
});
