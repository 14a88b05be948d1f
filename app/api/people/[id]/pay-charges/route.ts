import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { payByCardSchema, startCardPayment } from '@/lib/charges/card';
import { paymentsDeps } from '@/lib/payments/client';

export const POST = route({
  method: 'POST',
  summary:
    'Opens the card pay page for everything a person owes in charges (a member for themselves, a steward for anyone); a second press answers the same page',
  who: 'signed-in',
  params: idParams,
  notFound: 'person',
  body: json(payByCardSchema),
  response: z.object({
    payment: z.object({ paymentId: z.string(), amountMinor: z.number(), currency: z.string(), url: z.string() }),
  }),
  run: async ({ ctx, params, body }) => ({ payment: await startCardPayment(db, ctx, params.id, body, paymentsDeps(ctx.spaceId)) }),
});
