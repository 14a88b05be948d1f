import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { createInvitation, listInvitations } from '@/lib/people/invitations';
import { inviteSchema } from '@/lib/people/schema';

/** Open invitations of the admin's current space. */
export const GET = handle(async () => {
  const ctx = await requireRole('admin');
  return NextResponse.json({ invitations: await listInvitations(db, ctx) });
});

/** Invites someone by e-mail; the link goes out before this answers. */
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('admin');
  const input = await parseJsonBody(req, inviteSchema);
  return NextResponse.json({ invitation: await createInvitation(db, ctx, input) }, { status: 201 });
});
