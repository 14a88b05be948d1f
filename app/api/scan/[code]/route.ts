import { NextResponse } from 'next/server';
import { db } from '@/db';
import { handle } from '@/lib/http/respond';
import { shelfReader, type RouteParams } from '@/lib/inventory/access';
import { resolveCode } from '@/lib/inventory/resolve';

function safeDecode(s: string): string {
  try {
    return decodeURIComponent(s);
  } catch {
    return s;
  }
}

/**
 * A label code → what it labels and where its page is: { code, kind, targetId, name, href }.
 * 400 when the code's check symbol is wrong; 404 when no such code exists in the caller's space.
 */
export const GET = handle(async (_req: Request, { params }: RouteParams<{ code: string }>) => {
  const ctx = await shelfReader();
  const { code } = await params;
  return NextResponse.json(await resolveCode(db, ctx, safeDecode(code)), {
    headers: { 'Cache-Control': 'private, no-store' },
  });
});
