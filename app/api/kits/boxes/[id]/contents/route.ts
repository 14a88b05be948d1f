import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { takeOutSchema } from '@/lib/kits/schemas';
import { takeOutOfBox } from '@/lib/kits/upkeep';

export const POST = route({
  method: 'POST',
  summary:
    'Takes a unit (or a quantity of a counted part) out of a box, or swaps a unit for another of the same part',
  who: STAFF,
  params: idParams,
  notFound: 'kit box',
  body: json(takeOutSchema),
  response: z.object({
    change: z.object({ removed: z.string(), replacement: z.string().nullable(), boxState: z.string() }),
  }),
  run: async ({ ctx, params, body }) => ({ change: await takeOutOfBox(db, ctx, params.id, body) }),
});
