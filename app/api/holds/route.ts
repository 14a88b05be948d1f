import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { placeHold } from '@/lib/loans/holds';
import { listHolds } from '@/lib/loans/queries';
import { holdSchema } from '@/lib/loans/schemas';

export const GET = route({
  method: 'GET',
  summary: 'My open holds (stewards: ?all=1 for everyone’s)',
  who: 'signed-in',
  query: z.object({ all: z.enum(['0', '1']).optional() }),
  response: listOf('holds', 'An open hold with its place in line.'),
  run: async ({ ctx, query }) => ({ holds: await listHolds(db, ctx, { all: query.all === '1' }) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Holds a box or unit that is out',
  who: 'signed-in',
  body: json(holdSchema),
  status: 201,
  response: one('hold', 'The new hold.'),
  run: async ({ ctx, body }) => ({ hold: await placeHold(db, ctx, body) }),
});
