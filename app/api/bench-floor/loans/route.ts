import { NextResponse } from 'next/server';
import { borrowCounted, type BorrowInput } from '@/bench/floor-sql';
import { errorBody } from '@/lib/http/respond';
import { benchOn, notHere, pool } from '../pool';

export const dynamic = 'force-dynamic';

// Framework floor of the borrow transaction (bench/): the SQL of POST /api/loans for one counted item
// in a bare route handler — no sign-in, no validation, no space scoping. 404 unless OHM_BENCH=1.
export async function POST(req: Request) {
  if (!benchOn()) return notHere();
  const result = await borrowCounted(pool(), (await req.json()) as BorrowInput);
  if ('conflict' in result) return NextResponse.json(errorBody('conflict', result.conflict), { status: 409 });
  return NextResponse.json({ loan: result }, { status: 201 });
}
