import 'server-only';
import { scoped } from '@/db/scoped';
import type { Db } from '@/db/connect';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { monthKey, type Month } from '@/lib/sales/periods';
import type { ReconRow } from './match';

// A row of the reconciliation that does not match can be explained: the treasurer writes what they
// found (and did), and the row counts as resolved. The note carries who wrote it and when; writing
// again replaces it, and the audit log keeps each version.

export type Resolution = { note: string; writtenBy: string | null; writtenAt: string };

/** The notes on these rows of a space, by row key. */
export async function resolutionsOf(
  db: Db,
  spaceId: string,
  rowKeys: string[],
): Promise<Map<string, Resolution>> {
  if (!rowKeys.length) return new Map();
  const rows = await scoped(db, { spaceId })
    .selectFrom('recon_resolutions')
    .leftJoin('users', 'users.id', 'recon_resolutions.written_by')
    .select([
      'recon_resolutions.row_key',
      'recon_resolutions.note',
      'recon_resolutions.written_at',
      'users.name',
    ])
    .where('recon_resolutions.space_id', '=', spaceId)
    .where('recon_resolutions.row_key', 'in', rowKeys)
    .execute();
  return new Map(
    rows.map((r) => [r.row_key, { note: r.note, writtenBy: r.name, writtenAt: r.written_at.toISOString() }]),
  );
}

/**
 * Writes (or replaces) the note on one row of `month`'s reconciliation, which the caller has just
 * read for the caller's space: a row key that is not in it is a 404, whatever space it belongs to.
 */
export async function writeResolution(
  db: Db,
  ctx: Ctx,
  input: { month: Month; rowKey: string; note: string },
  rows: ReconRow[],
): Promise<Resolution & { rowKey: string }> {
  if (!hasRole(ctx, 'treasurer')) throw new ForbiddenError('Only the treasurer explains the books.');
  const row = rows.find((r) => r.key === input.rowKey);
  if (!row) throw new NotFoundError(`No row ${input.rowKey} in the books of ${input.month}.`);
  if (row.status === 'matched')
    throw new InvalidError('Check rowKey.', {
      rowKey: ['This row matches the processor: there is nothing to explain.'],
    });
  const note = input.note.trim();
  return db.transaction().execute(async (trx) => {
    const at = now();
    const saved = await scoped(trx, ctx)
      .insertInto('recon_resolutions')
      .values({
        space_id: ctx.spaceId,
        month: monthKey(input.month),
        row_key: row.key,
        sale_id: row.saleId,
        note,
        written_by: ctx.userId,
        written_at: at,
      })
      .onConflict((oc) =>
        oc.columns(['space_id', 'row_key']).doUpdateSet({ note, written_by: ctx.userId, written_at: at }),
      )
      .returning(['written_at'])
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'books.row_resolved',
      targetType: row.saleId ? 'sale' : 'ledger_row',
      targetId: row.saleId ?? row.key,
      detail: {
        month: input.month,
        rowKey: row.key,
        status: row.status,
        differenceMinor: row.differenceMinor,
        note,
      },
    });
    return { rowKey: row.key, note, writtenBy: ctx.name, writtenAt: saved.written_at.toISOString() };
  });
}
