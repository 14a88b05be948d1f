import { z } from 'zod';
import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { retryRelease } from '@/lib/deposits/release';
import { paymentsClient } from '@/lib/payments/client';

export const POST = route({
  method: 'POST',
  summary: 'Sends a deposit back again when the processor did not take its refund (the same refund, never a second)',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'loan',
  response: z.object({ deposit: z.object({ released: z.boolean() }) }),
  run: async ({ ctx, params }) => ({ deposit: await retryRelease(db, ctx, params.id, paymentsClient(ctx.spaceId)) }),
});
