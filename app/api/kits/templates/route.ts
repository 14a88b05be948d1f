import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole, requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { templateSchema } from '@/lib/kits/schemas';
import { createTemplate, listTemplates } from '@/lib/kits/templates';

export const GET = handle(async () => {
  const ctx = await requireUser();
  return NextResponse.json({ templates: await listTemplates(db, ctx) });
});

export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('steward', 'admin');
  const input = await parseJsonBody(req, templateSchema);
  const template = await createTemplate(db, ctx, input);
  return NextResponse.json({ template }, { status: 201 });
});
