import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { idOr404, type IdParams } from '@/lib/loans/ids';
import { renewLoan } from '@/lib/loans/renew';

export const POST = handle(async (_req: Request, { params }: IdParams) => {
  const ctx = await requireUser();
  const renewed = await renewLoan(db, ctx, idOr404((await params).id, 'loan'));
  return NextResponse.json({ renewed });
});
