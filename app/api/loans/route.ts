import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody, parseQuery } from '@/lib/http/respond';
import { borrow } from '@/lib/loans/borrow';
import { listLoans } from '@/lib/loans/queries';
import { borrowSchema, loanFilterSchema } from '@/lib/loans/schemas';

// GET: my loans (stewards: everyone's, or ?mine=1). POST: borrow — the check runs again on the server.
export const GET = handle(async (req: Request) => {
  const ctx = await requireUser();
  const q = parseQuery(req.url, loanFilterSchema);
  const loans = await listLoans(db, ctx, q.status, { mine: q.mine === '1' });
  return NextResponse.json({ loans });
});

export const POST = handle(async (req: Request) => {
  const ctx = await requireUser();
  const input = await parseJsonBody(req, borrowSchema);
  const loan = await borrow(db, ctx, input);
  return NextResponse.json({ loan }, { status: 201 });
});
