import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { signoffSchema } from '@/lib/inductions/schemas';
import { signOff } from '@/lib/inductions/signoffs';

export const POST = route({
  method: 'POST',
  summary: 'Signs a member off for an induction (optional last day, note); recorded with the steward’s name',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'induction',
  body: json(signoffSchema),
  status: 201,
  response: one('signoff', 'The sign-off.'),
  run: async ({ ctx, params, body }) => ({ signoff: await signOff(db, ctx, params.id, body) }),
});
