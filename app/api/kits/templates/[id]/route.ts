import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole, requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { templateSchema } from '@/lib/kits/schemas';
import { getTemplate, updateTemplate } from '@/lib/kits/templates';
import { idOr404, type IdParams } from '@/lib/loans/ids';

export const GET = handle(async (_req: Request, { params }: IdParams) => {
  const ctx = await requireUser();
  return NextResponse.json({ template: await getTemplate(db, ctx, idOr404((await params).id, 'kit')) });
});

/** Replaces the template: name, notes, cautions and the whole list of lines. */
export const PUT = handle(async (req: Request, { params }: IdParams) => {
  const ctx = await requireRole('steward', 'admin');
  const id = idOr404((await params).id, 'kit');
  const input = await parseJsonBody(req, templateSchema);
  await updateTemplate(db, ctx, id, input);
  return NextResponse.json({ template: { id } });
});
