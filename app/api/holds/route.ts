import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody, parseQuery } from '@/lib/http/respond';
import { placeHold } from '@/lib/loans/holds';
import { listHolds } from '@/lib/loans/queries';
import { holdSchema } from '@/lib/loans/schemas';

// GET: my open holds (stewards: ?all=1 for everyone's). POST: hold a box or unit that is out.
export const GET = handle(async (req: Request) => {
  const ctx = await requireUser();
  const q = parseQuery(req.url, z.object({ all: z.enum(['0', '1']).optional() }));
  const holds = await listHolds(db, ctx, { all: q.all === '1' });
  return NextResponse.json({ holds });
});

export const POST = handle(async (req: Request) => {
  const ctx = await requireUser();
  const input = await parseJsonBody(req, holdSchema);
  const hold = await placeHold(db, ctx, input);
  return NextResponse.json({ hold }, { status: 201 });
});
