import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { createInvitation, listInvitations } from '@/lib/people/invitations';
import { inviteSchema } from '@/lib/people/schema';

export const GET = route({
  method: 'GET',
  summary: 'Open invitations of the admin’s current space',
  who: ['admin'],
  response: listOf('invitations', 'An open invitation.'),
  run: async ({ ctx }) => ({ invitations: await listInvitations(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Invites someone by e-mail; the link goes out before this answers',
  who: ['admin'],
  body: json(inviteSchema),
  status: 201,
  response: one('invitation', 'The new invitation.'),
  run: async ({ ctx, body }) => ({ invitation: await createInvitation(db, ctx, body) }),
});
