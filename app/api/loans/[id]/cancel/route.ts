import { z } from 'zod';
import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { cancelBorrow, finishGiveUp } from '@/lib/loans/cancel';
import { notifyReadyHolds } from '@/lib/loans/notify';
import { paymentsClient } from '@/lib/payments/client';

export const POST = route({
  method: 'POST',
  summary: 'Gives up a borrow still waiting (at the bench, or for its deposit): what was kept goes back; a paid deposit is given back',
  who: 'signed-in',
  params: idParams,
  notFound: 'loan',
  response: z.object({ loan: z.object({ id: z.string(), status: z.literal('cancelled') }) }),
  run: async ({ ctx, params }) => {
    const g = await cancelBorrow(db, ctx, params.id);
    // After commit: close the deposit's pay page or give the deposit back, then tell the next person waiting.
    if (g.depositToSend || g.sessionToExpire) await finishGiveUp(db, paymentsClient(ctx.spaceId), ctx.spaceId, g);
    await notifyReadyHolds(db, g.readyHoldIds);
    return { loan: { id: params.id, status: 'cancelled' as const } };
  },
});
