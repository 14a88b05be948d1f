import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { createFirstSpace } from '@/lib/setup/first-run';
import { firstRunSchema } from '@/lib/setup/schemas';

// Public only while no space exists; from the first space on it answers 404 for good.
export const POST = route({
  method: 'POST',
  summary: 'Creates the first space and its first admin (only while no space exists; 404 after)',
  who: 'anonymous',
  status: 201,
  body: json(firstRunSchema),
  response: z.object({ spaceId: z.string().uuid() }),
  run: async ({ body }) => {
    const { spaceId } = await createFirstSpace(db, body);
    return { spaceId };
  },
});
