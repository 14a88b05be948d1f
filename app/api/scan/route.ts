import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { existingCodes } from '@/lib/inventory/resolve';
import { codesLookupSchema } from '@/lib/inventory/schemas';

export const POST = route({
  method: 'POST',
  summary: '“Did you mean”: of these candidate codes (at most 20), the ones that exist here',
  who: 'signed-in',
  body: json(codesLookupSchema),
  response: z.object({ found: z.array(z.unknown()) }),
  run: async ({ ctx, body }) => ({ found: await existingCodes(db, ctx, body.codes) }),
});
