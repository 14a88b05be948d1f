import { z } from 'zod';
import { db } from '@/db';
import { idSchema } from '@/lib/ids';
import { multipart, route, STAFF, TooLarge } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { MAX_ATTACHMENT_BYTES } from '@/lib/inventory/attachment-type';
import { addAttachment } from '@/lib/inventory/attachments';

// Room for the multipart envelope around the file itself.
const ENVELOPE_BYTES = 64 * 1024;
const uploadSchema = z.object({ partId: idSchema, file: z.file({ error: 'choose a file to upload' }) });

export const POST = route({
  method: 'POST',
  summary: 'Attaches a file to a part (PDF, JPEG, PNG or WebP up to 5 MB, judged by content)',
  who: STAFF,
  body: multipart(
    uploadSchema,
    MAX_ATTACHMENT_BYTES + ENVELOPE_BYTES,
    z.object({ partId: idSchema, file: z.string().meta({ format: 'binary', description: 'The file.' }) }),
  ),
  status: 201,
  response: record('The stored attachment: id, filename, mime, size.'),
  run: async ({ ctx, body }) => {
    if (body.file.size > MAX_ATTACHMENT_BYTES) throw new TooLarge(MAX_ATTACHMENT_BYTES);
    return addAttachment(db, ctx, body.partId, { name: body.file.name, bytes: new Uint8Array(await body.file.arrayBuffer()) });
  },
});
