import { z } from 'zod';
import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { acceptInvitation } from '@/lib/people/invitations';
import { acceptInvitationSchema } from '@/lib/people/schema';

// Public by design: the token from the e-mailed link is the credential, and it works once. The same 404
// answers an unknown, used, withdrawn or expired token.
export const POST = route({
  method: 'POST',
  summary: 'Accepts an invitation with the token from its link (public; works once)',
  who: 'anonymous',
  body: json(acceptInvitationSchema),
  response: z.object({ email: z.string(), newAccount: z.boolean() }),
  run: async ({ body }) => {
    const accepted = await acceptInvitation(db, body);
    return { email: accepted.email, newAccount: accepted.newAccount };
  },
});
