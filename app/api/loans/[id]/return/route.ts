import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { notifyReadyHolds } from '@/lib/loans/notify';
import { returnLoan } from '@/lib/loans/return';
import { returnSchema } from '@/lib/loans/schemas';

export const POST = route({
  method: 'POST',
  summary: 'Returns a loan at the bench (a steward, or the borrower): each line back, missing or damaged',
  who: 'signed-in',
  params: idParams,
  notFound: 'loan',
  body: json(returnSchema),
  response: z.object({ return: z.object({ status: z.string(), short: z.unknown() }) }),
  run: async ({ ctx, params, body }) => {
    const result = await returnLoan(db, ctx, params.id, body);
    // After commit: tell the next person waiting. A failed mail is retried by the reminder sweep.
    await notifyReadyHolds(db, result.readyHoldIds);
    return { return: { status: result.status, short: result.short } };
  },
});
