import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle } from '@/lib/http/respond';
import { shelfReader, shelfWriter, type RouteParams } from '@/lib/inventory/access';
import { attachmentHeaders } from '@/lib/inventory/attachment-type';
import { deleteAttachment, getAttachment } from '@/lib/inventory/attachments';

/** The stored bytes with the type detected at upload; non-images download rather than open. */
export const GET = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfReader();
  const { id } = await params;
  const a = await getAttachment(db, ctx, id);
  return new Response(new Uint8Array(a.data), {
    headers: attachmentHeaders(a.mime, a.filename, a.size_bytes),
  });
});

export const DELETE = handle(async (_req: Request, { params }: RouteParams<{ id: string }>) => {
  const ctx = await shelfWriter();
  const { id } = await params;
  return NextResponse.json(await deleteAttachment(db, ctx, id));
});
