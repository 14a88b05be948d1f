import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { sendRelease } from '@/lib/deposits/release';
import { sendChargeNotice } from '@/lib/mail/charges';
import { notifyReadyHolds } from '@/lib/loans/notify';
import { returnLoan } from '@/lib/loans/return';
import { returnSchema } from '@/lib/loans/schemas';
import { paymentsClient } from '@/lib/payments/client';

export const POST = route({
  method: 'POST',
  summary:
    'Returns a loan at the bench (a steward, or the borrower): each line back, missing or damaged; a steward may charge for a line, taken from the deposit first, and the rest of the deposit goes back',
  who: 'signed-in',
  params: idParams,
  notFound: 'loan',
  body: json(returnSchema),
  response: z.object({
    return: z.object({
      status: z.string(),
      short: z.unknown(),
      charged: z.unknown(),
      depositReleased: z.boolean(),
    }),
  }),
  run: async ({ ctx, params, body }) => {
    const result = await returnLoan(db, ctx, params.id, body);
    // After commit: the deposit's refund (one, by its idempotency key), then tell the next person waiting.
    const depositReleased = result.depositToSend
      ? await sendRelease(db, paymentsClient(ctx.spaceId), ctx.spaceId, result.depositToSend)
      : false;
    await notifyReadyHolds(db, result.readyHoldIds);
    if (result.charged) await sendChargeNotice(db, ctx.spaceId, params.id, result.charged);
    return { return: { status: result.status, short: result.short, charged: result.charged, depositReleased } };
  },
});
