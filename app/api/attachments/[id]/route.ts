import { db } from '@/db';
import { idParams, route, STAFF } from '@/lib/http/route';
import { ok } from '@/lib/http/shapes';
import { attachmentHeaders } from '@/lib/inventory/attachment-type';
import { deleteAttachment, getAttachment } from '@/lib/inventory/attachments';

export const GET = route({
  method: 'GET',
  summary: 'An attachment’s bytes, typed by content; non-images download rather than open',
  who: 'signed-in',
  params: idParams,
  notFound: 'attachment',
  produces: { contentType: 'application/octet-stream', description: 'The stored file (PDF, JPEG, PNG or WebP).' },
  run: async ({ ctx, params }) => {
    const a = await getAttachment(db, ctx, params.id);
    return new Response(new Uint8Array(a.data), { headers: attachmentHeaders(a.mime, a.filename, a.size_bytes) });
  },
});

export const DELETE = route({
  method: 'DELETE',
  summary: 'Removes an attachment from its part',
  who: STAFF,
  params: idParams,
  notFound: 'attachment',
  response: ok,
  run: ({ ctx, params }) => deleteAttachment(db, ctx, params.id),
});
