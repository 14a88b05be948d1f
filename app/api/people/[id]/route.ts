import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { updatePerson } from '@/lib/people/people';
import { parseId, updatePersonSchema } from '@/lib/people/schema';

/** Changes roles in the current space and/or disables or enables the account. */
export const PATCH = handle(async (req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const ctx = await requireRole('admin');
  const id = parseId((await params).id);
  const input = await parseJsonBody(req, updatePersonSchema);
  return NextResponse.json({ person: await updatePerson(db, ctx, id, input) });
});
