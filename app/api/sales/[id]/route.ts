import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { now } from '@/lib/clock';
import { handle } from '@/lib/http/respond';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import { saleFor } from '@/lib/sales/access';
import { saleIdParam } from '@/lib/sales/params';
import { isProcessorUnreachable } from '@/lib/sales/processor-errors';
import { saleView } from '@/lib/sales/read';
import { settleSale } from '@/lib/sales/settle';

export const dynamic = 'force-dynamic';

// GET: one sale (the counter's status page polls this). A pending sale past its expiry is settled
// with the processor on the way, so the page never waits on a sale nobody can pay any more.
export const GET = handle(async (_req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireUser();
  const id = await saleIdParam(params);
  const sale = await saleFor(db, ctx, id);
  if (sale.status === 'pending' && sale.method === 'card' && sale.expires_at && sale.expires_at < now()) {
    try {
      const settled = await settleSale(db, paymentsClient(ctx.spaceId), sale, {
        expireOpen: true,
        source: 'status check',
      });
      if (settled.receipt) await sendReceipts(db, [sale.id]);
    } catch (err) {
      if (!isProcessorUnreachable(err)) throw err; // unreachable: show it pending; the sweep asks again
    }
  }
  return NextResponse.json({ sale: await saleView(db, ctx, id) });
});
