import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { listOf, record } from '@/lib/http/shapes';
import { listOpenCounts, openCount } from '@/lib/inventory/counts';
import { countOpenSchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'Open stock counts of the space',
  who: 'signed-in',
  response: listOf('counts', 'An open count.'),
  run: async ({ ctx }) => ({ counts: await listOpenCounts(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Opens a count for a bin, or returns the one already open there (201 when new)',
  who: STAFF,
  body: json(countOpenSchema),
  response: record('The count and whether it was created.'),
  run: async ({ ctx, body }) => {
    const opened = await openCount(db, ctx, body.locationId);
    return Response.json(opened, { status: opened.created ? 201 : 200 });
  },
});
