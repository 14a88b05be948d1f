import 'server-only';
import { createHash } from 'node:crypto';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { InvalidError, NotFoundError } from '@/lib/errors';
import { cleanFilename, detectAttachmentType } from './attachment-type';
import { assertId, findPart } from './scope';
import { inTransaction } from './tx';

/** Stores a datasheet or photo on a part, after checking its real type from its bytes. */
export async function addAttachment(
  db: Db,
  ctx: Ctx,
  partId: string,
  file: { name: string; bytes: Uint8Array },
) {
  const detected = await detectAttachmentType(file.bytes);
  if (!detected.ok)
    throw new InvalidError(`The file was refused: ${detected.message}.`, { file: [detected.message] });
  const filename = cleanFilename(file.name, detected.ext);
  const sha256 = createHash('sha256').update(file.bytes).digest('hex');
  return inTransaction(db, async (trx) => {
    await findPart(trx, ctx, partId);
    const row = await scoped(trx, ctx)
      .insertInto('attachments')
      .values({
        space_id: ctx.spaceId,
        part_id: partId,
        filename,
        mime: detected.mime,
        size_bytes: file.bytes.byteLength,
        sha256,
        data: Buffer.from(file.bytes),
        created_by: ctx.userId,
      })
      .returning(['id', 'filename', 'mime', 'size_bytes as sizeBytes', 'created_at as createdAt'])
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'attachment.added',
      targetType: 'part',
      targetId: partId,
      detail: { id: row.id, filename, mime: detected.mime, sha256 },
    });
    return row;
  });
}

export async function getAttachment(db: Db, ctx: Pick<Ctx, 'spaceId'>, id: string) {
  assertId(id, 'attachment');
  const row = await scoped(db, ctx)
    .selectFrom('attachments')
    .select(['id', 'filename', 'mime', 'size_bytes', 'data', 'part_id'])
    .where('id', '=', id)
    .where('space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!row) throw new NotFoundError('No such attachment.');
  return row;
}

export async function deleteAttachment(db: Db, ctx: Ctx, id: string) {
  assertId(id, 'attachment');
  return inTransaction(db, async (trx) => {
    const row = await scoped(trx, ctx)
      .deleteFrom('attachments')
      .where('id', '=', id)
      .where('space_id', '=', ctx.spaceId)
      .returning(['id', 'part_id', 'filename'])
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such attachment.');
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'attachment.deleted',
      targetType: 'part',
      targetId: row.part_id,
      detail: { id, filename: row.filename },
    });
    return { id };
  });
}
