import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { refillBox } from '@/lib/kits/boxes';
import { refillSchema } from '@/lib/kits/schemas';
import { notifyReadyHolds } from '@/lib/loans/notify';

export const POST = route({
  method: 'POST',
  summary: 'Refills what a box lacks against its template; a box in repair goes back on the shelf',
  who: STAFF,
  params: idParams,
  notFound: 'kit box',
  body: json(refillSchema.optional().transform((v) => v ?? { unitIds: [], fromLocations: [] }), refillSchema.optional()),
  response: z.object({ refill: z.object({ added: z.array(z.string()), removed: z.array(z.string()) }) }),
  run: async ({ ctx, params, body }) => {
    const result = await refillBox(db, ctx, params.id, body);
    if (result.readyHoldId) await notifyReadyHolds(db, [result.readyHoldId]);
    return { refill: { added: result.added, removed: result.removed } };
  },
});
