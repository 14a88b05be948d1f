import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { idOr404, type IdParams } from '@/lib/loans/ids';
import { notifyReadyHolds } from '@/lib/loans/notify';
import { returnLoan } from '@/lib/loans/return';
import { returnSchema } from '@/lib/loans/schemas';

// Return at the bench (a steward, or the borrower): each line back, missing or damaged.
export const POST = handle(async (req: Request, { params }: IdParams) => {
  const ctx = await requireUser();
  const id = idOr404((await params).id, 'loan');
  const input = await parseJsonBody(req, returnSchema);
  const result = await returnLoan(db, ctx, id, input);
  // After commit: tell the next person waiting. A failed mail is retried by the reminder sweep.
  await notifyReadyHolds(db, result.readyHoldIds);
  return NextResponse.json({ return: { status: result.status, short: result.short } });
});
