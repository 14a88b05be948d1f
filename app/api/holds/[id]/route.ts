import { z } from 'zod';
import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { cancelHold } from '@/lib/loans/holds';
import { notifyReadyHolds } from '@/lib/loans/notify';

export const DELETE = route({
  method: 'DELETE',
  summary: 'Cancels a hold (the holder, or a steward); a ready hold passes to the next in line',
  who: 'signed-in',
  params: idParams,
  notFound: 'hold',
  response: z.object({ cancelled: z.literal(true) }),
  run: async ({ ctx, params }) => {
    const { readyHoldId } = await cancelHold(db, ctx, params.id);
    if (readyHoldId) await notifyReadyHolds(db, [readyHoldId]);
    return { cancelled: true };
  },
});
