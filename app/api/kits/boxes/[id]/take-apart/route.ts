import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { takeApartSchema } from '@/lib/kits/schemas';
import { takeBoxApart } from '@/lib/kits/upkeep';

export const POST = route({
  method: 'POST',
  summary: 'Takes a box apart: its contents go back on the shelf and the box is retired',
  who: STAFF,
  params: idParams,
  notFound: 'kit box',
  body: json(
    takeApartSchema.optional().transform((v) => v ?? { reason: '' }),
    takeApartSchema.optional(),
  ),
  response: z.object({ takenApart: z.object({ returned: z.array(z.string()) }) }),
  run: async ({ ctx, params, body }) => ({ takenApart: await takeBoxApart(db, ctx, params.id, body) }),
});
