import { db } from '@/db';
import { route } from '@/lib/http/route';
import { listOf } from '@/lib/http/shapes';
import { signoffFilterSchema } from '@/lib/inductions/schemas';
import { listSignoffs } from '@/lib/inductions/signoffs';

export const GET = route({
  method: 'GET',
  summary: 'Sign-offs: a member’s own; stewards and admins everyone’s, or one person’s (?userId=)',
  who: 'signed-in',
  query: signoffFilterSchema,
  response: listOf('signoffs', 'A sign-off.'),
  run: async ({ ctx, query }) => ({ signoffs: await listSignoffs(db, ctx, { userId: query.userId }) }),
});
