import { NextResponse } from 'next/server';
import { lookupByCode } from '@/bench/floor-sql';
import { benchOn, notHere, pool } from '../../pool';

export const dynamic = 'force-dynamic';

// Framework floor of the scan → item lookup (bench/): the SQL of GET /api/scan/[code] in a bare route
// handler — no sign-in, no validation, no space scoping. 404 unless OHM_BENCH=1.
export async function GET(_req: Request, { params }: { params: Promise<{ code: string }> }) {
  if (!benchOn()) return notHere();
  const found = await lookupByCode(pool(), (await params).code);
  return found ? NextResponse.json(found, { headers: { 'Cache-Control': 'private, no-store' } }) : notHere();
}
