import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { handle } from '@/lib/http/respond';
import { getBox } from '@/lib/kits/box-detail';
import { idOr404, type IdParams } from '@/lib/loans/ids';
import { previewLoan } from '@/lib/loans/preview';

// A box with its contents and the check on its exact units (as the box page shows it).
export const GET = handle(async (_req: Request, { params }: IdParams) => {
  const ctx = await requireUser();
  const id = idOr404((await params).id, 'kit box');
  const box = await getBox(db, ctx, id);
  const preview = await previewLoan(db, ctx, { kitBoxId: id });
  return NextResponse.json({
    box,
    check: {
      verdict: preview.outcome.verdict,
      outcome: preview.outcome,
      available: preview.available,
      unavailable: preview.unavailable,
      dueAt: preview.dueAt,
    },
  });
});
