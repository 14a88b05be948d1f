import { NextResponse } from 'next/server';
import { db } from '@/db';
import { InvalidError } from '@/lib/errors';
import { errorBody, handle } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { MAX_ATTACHMENT_BYTES } from '@/lib/inventory/attachment-type';
import { addAttachment } from '@/lib/inventory/attachments';
import { assertId } from '@/lib/inventory/scope';

const TOO_LARGE = `the file is larger than ${MAX_ATTACHMENT_BYTES / 1024 / 1024} MB`;
// Room for the multipart envelope around the file itself.
const ENVELOPE_BYTES = 64 * 1024;

/** multipart/form-data with `partId` and `file` (PDF, JPEG, PNG or WebP up to 5 MB, judged by content). */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const declared = Number(req.headers.get('content-length') ?? '0');
  if (declared > MAX_ATTACHMENT_BYTES + ENVELOPE_BYTES) {
    return NextResponse.json(
      errorBody('invalid', `The file was refused: ${TOO_LARGE}.`, { file: [TOO_LARGE] }),
      { status: 413 },
    );
  }
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new InvalidError('Send the file as multipart/form-data.', { file: ['no file in the request'] });
  }
  const partId = form.get('partId');
  const file = form.get('file');
  if (typeof partId !== 'string' || !partId)
    throw new InvalidError('Say which part the file belongs to.', { partId: ['required'] });
  assertId(partId, 'part');
  if (!file || typeof file === 'string')
    throw new InvalidError('Choose a file to upload.', { file: ['required'] });
  if (file.size > MAX_ATTACHMENT_BYTES) {
    return NextResponse.json(
      errorBody('invalid', `The file was refused: ${TOO_LARGE}.`, { file: [TOO_LARGE] }),
      { status: 413 },
    );
  }
  const bytes = new Uint8Array(await file.arrayBuffer());
  return NextResponse.json(await addAttachment(db, ctx, partId, { name: file.name, bytes }), { status: 201 });
});
