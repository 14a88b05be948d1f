import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { createInduction, listInductions } from '@/lib/inductions/manage';
import { inductionSchema } from '@/lib/inductions/schemas';

export const GET = route({
  method: 'GET',
  summary: 'The space’s inductions and what needs each (kit templates, part categories)',
  who: 'signed-in',
  response: listOf('inductions', 'An induction.'),
  run: async ({ ctx }) => ({ inductions: await listInductions(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Defines an induction in the space’s own words, and what needs it',
  who: ['steward', 'admin'],
  body: json(inductionSchema),
  status: 201,
  response: one('induction', 'The new induction.'),
  run: async ({ ctx, body }) => ({ induction: await createInduction(db, ctx, body) }),
});
