import 'server-only';
import { scoped } from '@/db/scoped';
import { TZDate } from '@date-fns/tz';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import type { SignoffInput } from './schemas';

// A steward's word that a member was shown an induction: who signed, when, until when, and a note.
// A sign-off is revoked, never deleted; every change has its audit row in the same transaction.

export type Signoff = {
  id: string;
  inductionId: string;
  induction: string;
  userId: string;
  person: string;
  signedBy: string | null;
  signedAt: Date;
  expiresAt: Date | null;
  note: string;
  revokedAt: Date | null;
  /** Holds now: not revoked, not expired. */
  current: boolean;
};

/** The end of local day `day` in `timeZone`: the first instant of the next day. */
export function endOfLocalDay(day: string, timeZone: string): Date {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(new TZDate(y, m - 1, d + 1, 0, 0, 0, 0, timeZone).getTime());
}

async function spaceZone(db: Db, spaceId: string): Promise<string> {
  const s = await db.selectFrom('spaces').select('time_zone').where('id', '=', spaceId).executeTakeFirstOrThrow();
  return s.time_zone;
}

export async function signOff(db: Db, ctx: Ctx, inductionId: string, input: SignoffInput): Promise<Signoff> {
  const id = await db.transaction().execute(async (trx) => {
    const induction = await scoped(trx, ctx)
      .selectFrom('inductions')
      .select(['id', 'name', 'archived_at'])
      .where('id', '=', inductionId)
      .where('space_id', '=', ctx.spaceId)
      .executeTakeFirst();
    if (!induction) throw new NotFoundError('No such induction.');
    if (induction.archived_at)
      throw new ConflictError(`“${induction.name}” is archived; bring it back before signing anyone off.`, {
        inductionId: ['archived'],
      });
    const member = await scoped(trx, ctx)
      .selectFrom('memberships')
      .select('user_id')
      .where('space_id', '=', ctx.spaceId)
      .where('user_id', '=', input.userId)
      .where('disabled_at', 'is', null)
      .executeTakeFirst();
    if (!member) throw new InvalidError('That person is not a member of this space.', { userId: ['not a member here'] });
    const at = now();
    const expiresAt = input.expiresOn ? endOfLocalDay(input.expiresOn, await spaceZone(trx, ctx.spaceId)) : null;
    if (expiresAt && expiresAt <= at)
      throw new InvalidError('The expiry date has already passed.', { expiresOn: ['must be today or later'] });
    const row = await scoped(trx, ctx)
      .insertInto('induction_signoffs')
      .values({
        space_id: ctx.spaceId,
        induction_id: inductionId,
        user_id: input.userId,
        signed_by: ctx.userId,
        signed_at: at,
        expires_at: expiresAt,
        note: input.note,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'induction.signed_off',
      targetType: 'induction_signoff',
      targetId: row.id,
      detail: { induction: induction.name, userId: input.userId, expiresAt: expiresAt?.toISOString() ?? null, note: input.note },
    });
    return row.id;
  });
  const [one] = await listSignoffs(db, ctx, { id });
  return one;
}

export async function revokeSignoff(db: Db, ctx: Ctx, signoffId: string): Promise<Signoff> {
  await db.transaction().execute(async (trx) => {
    const row = await scoped(trx, ctx)
      .selectFrom('induction_signoffs')
      .select(['id', 'revoked_at', 'user_id', 'induction_id'])
      .where('id', '=', signoffId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No such sign-off.');
    if (row.revoked_at) throw new ConflictError('This sign-off was already withdrawn.', { id: ['already withdrawn'] });
    await scoped(trx, ctx)
      .updateTable('induction_signoffs')
      .set({ revoked_at: now(), revoked_by: ctx.userId })
      .where('id', '=', signoffId)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'induction.signoff_withdrawn',
      targetType: 'induction_signoff',
      targetId: signoffId,
      detail: { userId: row.user_id, inductionId: row.induction_id },
    });
  });
  const [one] = await listSignoffs(db, ctx, { id: signoffId });
  return one;
}

/**
 * Sign-offs in the caller's space, newest first. A member sees only their own, whatever they ask for;
 * a steward or admin sees one person's (`userId`) or everyone's.
 */
export async function listSignoffs(db: Db, ctx: Ctx, opts: { userId?: string; id?: string } = {}): Promise<Signoff[]> {
  const at = now();
  let q = scoped(db, ctx)
    .selectFrom('induction_signoffs as s')
    .innerJoin('inductions as i', (j) => j.onRef('i.id', '=', 's.induction_id').onRef('i.space_id', '=', 's.space_id'))
    .innerJoin('users as u', 'u.id', 's.user_id')
    .leftJoin('users as by', 'by.id', 's.signed_by')
    .select([
      's.id',
      's.induction_id as inductionId',
      'i.name as induction',
      's.user_id as userId',
      'u.name as person',
      'by.name as signedBy',
      's.signed_at as signedAt',
      's.expires_at as expiresAt',
      's.note',
      's.revoked_at as revokedAt',
    ])
    .where('s.space_id', '=', ctx.spaceId)
    .orderBy('s.signed_at', 'desc');
  const who = isStaff(ctx) ? opts.userId : ctx.userId;
  if (who) q = q.where('s.user_id', '=', who);
  if (opts.id) q = q.where('s.id', '=', opts.id);
  const rows = await q.execute();
  return rows.map((r) => ({
    ...r,
    current: r.revokedAt === null && (r.expiresAt === null || new Date(r.expiresAt) > at),
  }));
}
