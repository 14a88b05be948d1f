import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { cancelHold } from '@/lib/loans/holds';
import { idOr404, type IdParams } from '@/lib/loans/ids';
import { notifyReadyHolds } from '@/lib/loans/notify';

// Cancel a hold (the holder, or a steward). A ready hold passes the item to the next in line.
export const DELETE = handle(async (_req: Request, { params }: IdParams) => {
  const ctx = await requireUser();
  const { readyHoldId } = await cancelHold(db, ctx, idOr404((await params).id, 'hold'));
  if (readyHoldId) await notifyReadyHolds(db, [readyHoldId]);
  return NextResponse.json({ cancelled: true });
});
