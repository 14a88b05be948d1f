import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { settleCharges, settleSchema } from '@/lib/charges/settle';

export const POST = route({
  method: 'POST',
  summary: 'Records cash a member paid towards what they owe for charges (oldest charges first)',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'person',
  body: json(settleSchema),
  response: z.object({ settled: z.object({ settledMinor: z.number(), owedMinor: z.number(), currency: z.string() }) }),
  run: async ({ ctx, params, body }) => ({ settled: await settleCharges(db, ctx, params.id, body) }),
});
