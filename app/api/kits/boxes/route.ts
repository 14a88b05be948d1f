import { z } from 'zod';
import { db } from '@/db';
import { idSchema } from '@/lib/ids';
import { json, route, STAFF } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { buildBox, listBoxes } from '@/lib/kits/boxes';
import { buildBoxSchema } from '@/lib/kits/schemas';

export const GET = route({
  method: 'GET',
  summary: 'Kit boxes of the space (?templateId= for one kit’s boxes)',
  who: 'signed-in',
  query: z.object({ templateId: idSchema.optional() }),
  response: listOf('boxes', 'A kit box with its state.'),
  run: async ({ ctx, query }) => ({ boxes: await listBoxes(db, ctx, query) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Builds a box from a template: units and counted stock leave the shelf',
  who: STAFF,
  body: json(buildBoxSchema),
  status: 201,
  response: one('box', 'The new box.'),
  run: async ({ ctx, body }) => ({ box: await buildBox(db, ctx, body) }),
});
