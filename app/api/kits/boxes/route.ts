import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { requireRole, requireUser } from '@/lib/auth/guard';
import { handle, parseJsonBody, parseQuery } from '@/lib/http/respond';
import { buildBox, listBoxes } from '@/lib/kits/boxes';
import { buildBoxSchema } from '@/lib/kits/schemas';

export const GET = handle(async (req: Request) => {
  const ctx = await requireUser();
  const q = parseQuery(
    req.url,
    z.object({ templateId: z.uuid({ error: 'templateId must be an id' }).optional() }),
  );
  return NextResponse.json({ boxes: await listBoxes(db, ctx, q) });
});

/** Builds a box from a template: units and counted stock leave the shelf ('kit_build'). */
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('steward', 'admin');
  const input = await parseJsonBody(req, buildBoxSchema);
  const box = await buildBox(db, ctx, input);
  return NextResponse.json({ box }, { status: 201 });
});
