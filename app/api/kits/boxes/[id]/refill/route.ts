import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { refillBox } from '@/lib/kits/boxes';
import { refillSchema } from '@/lib/kits/schemas';
import { idOr404, type IdParams } from '@/lib/loans/ids';
import { notifyReadyHolds } from '@/lib/loans/notify';

/** Refills what the box lacks against its template; a box in repair goes back on the shelf. */
export const POST = handle(async (req: Request, { params }: IdParams) => {
  const ctx = await requireRole('steward', 'admin');
  const id = idOr404((await params).id, 'kit box');
  const picks = await parseJsonBody(
    req,
    refillSchema.optional().transform((v) => v ?? { unitIds: [], fromLocations: [] }),
  );
  const result = await refillBox(db, ctx, id, picks);
  if (result.readyHoldId) await notifyReadyHolds(db, [result.readyHoldId]);
  return NextResponse.json({ refill: { added: result.added } });
});
