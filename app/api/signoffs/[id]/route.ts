import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { revokeSignoff } from '@/lib/inductions/signoffs';

export const DELETE = route({
  method: 'DELETE',
  summary: 'Withdraws a sign-off (kept on record, marked withdrawn)',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'sign-off',
  response: one('signoff', 'The withdrawn sign-off.'),
  run: async ({ ctx, params }) => ({ signoff: await revokeSignoff(db, ctx, params.id) }),
});
