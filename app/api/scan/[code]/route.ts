import { z } from 'zod';
import { db } from '@/db';
import { route } from '@/lib/http/route';
import { resolveCode } from '@/lib/inventory/resolve';

function safeDecode(s: string): string {
  try {
    return decodeURIComponent(s);
  } catch {
    return s;
  }
}

// 400 when the code's check symbol is wrong; 404 when no such code exists in the caller's space.
export const GET = route({
  method: 'GET',
  summary: 'A label code → what it labels and where its page is',
  who: 'signed-in',
  params: z.object({ code: z.string().max(200).transform(safeDecode) }),
  notFound: 'label',
  response: z.object({ code: z.string(), kind: z.string(), targetId: z.string(), name: z.string(), href: z.string() }),
  run: async ({ ctx, params }) =>
    Response.json(await resolveCode(db, ctx, params.code), { headers: { 'Cache-Control': 'private, no-store' } }),
});
