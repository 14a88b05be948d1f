import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { ForbiddenError } from '@/lib/errors';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { previewLoan } from '@/lib/loans/preview';
import { previewSchema } from '@/lib/loans/schemas';

// The check on the exact parts before borrowing: report, cautions, what to change, what works instead.
export const POST = handle(async (req: Request) => {
  const ctx = await requireUser();
  const { selection, borrowerId, ownParts } = await parseJsonBody(req, previewSchema);
  if (borrowerId && borrowerId !== ctx.userId && !isStaff(ctx)) throw new ForbiddenError();
  const preview = await previewLoan(db, ctx, selection, { borrowerId, ownParts });
  return NextResponse.json({ preview });
});
