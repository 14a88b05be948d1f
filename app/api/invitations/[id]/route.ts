import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { withdrawInvitation } from '@/lib/people/invitations';
import { parseId } from '@/lib/people/schema';

/** Withdraws an open invitation; its link stops working. */
export const DELETE = handle(async (_req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireRole('admin');
  await withdrawInvitation(db, ctx, parseId((await params).id));
  return NextResponse.json({ ok: true });
});
