import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { acceptInvitation } from '@/lib/people/invitations';
import { acceptInvitationSchema } from '@/lib/people/schema';

/**
 * Public by design: the token from the e-mailed link is the credential, and it works once.
 * Answers the same 404 for an unknown, used, withdrawn or expired token.
 */
export const POST = handle(async (req: Request) => {
  const input = await parseJsonBody(req, acceptInvitationSchema);
  const accepted = await acceptInvitation(db, input);
  return NextResponse.json({ email: accepted.email, newAccount: accepted.newAccount });
});
