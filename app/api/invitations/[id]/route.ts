import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { ok } from '@/lib/http/shapes';
import { withdrawInvitation } from '@/lib/people/invitations';

export const DELETE = route({
  method: 'DELETE',
  summary: 'Withdraws an open invitation; its link stops working',
  who: ['admin'],
  params: idParams,
  notFound: 'invitation',
  response: ok,
  run: async ({ ctx, params }) => {
    await withdrawInvitation(db, ctx, params.id);
    return { ok: true };
  },
});
