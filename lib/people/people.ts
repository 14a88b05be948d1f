import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Role } from '@/db/types';
import type { Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import type { UpdatePersonInput } from './schema';

export type Person = {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  /** Their access to this space is switched off (their other spaces are not affected). */
  disabled: boolean;
  joinedAt: Date;
};

const isAdmin = sql<boolean>`'admin' = any(memberships.roles)`;

function peopleOf(db: Db, spaceId: string) {
  return scoped(db, { spaceId })
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select([
      'users.id',
      'users.name',
      'users.email',
      'memberships.disabled_at',
      'memberships.roles',
      'memberships.created_at',
    ])
    .where('memberships.space_id', '=', spaceId);
}

type PersonRow = Awaited<ReturnType<ReturnType<typeof peopleOf>['executeTakeFirstOrThrow']>>;
const toPerson = (r: PersonRow): Person => ({
  id: r.id,
  name: r.name,
  email: r.email,
  roles: r.roles,
  disabled: r.disabled_at !== null,
  joinedAt: r.created_at,
});

/** Everyone with a membership in the caller's current space, by name. */
export async function listPeople(db: Db, ctx: Pick<Ctx, 'spaceId'>): Promise<Person[]> {
  const rows = await peopleOf(db, ctx.spaceId).orderBy('users.name').orderBy('users.email').execute();
  return rows.map(toPerson);
}

/**
 * Changes a person's roles in the current space and/or switches their access to this space off or on.
 * Both act on this space's membership only: the person's other spaces, and their sessions there, carry
 * on. A person outside the space is 404. The space keeps at least one enabled admin (409 otherwise).
 * Roles and access are read by the guard on every request, so the change holds from the person's next
 * request on.
 */
export async function updatePerson(
  db: Db,
  ctx: Ctx,
  userId: string,
  input: UpdatePersonInput,
): Promise<Person> {
  return db.transaction().execute(async (trx) => {
    // Admin changes are serialised per space by locking the space row, so two admins demoting or
    // disabling each other at the same moment cannot both succeed. NO KEY UPDATE does not block inserts
    // elsewhere that merely reference the space.
    await trx.selectFrom('spaces').select('id').where('id', '=', ctx.spaceId).forNoKeyUpdate().execute();
    // Read after the lock: in READ COMMITTED this statement sees whatever the previous holder committed.
    const rows = await scoped(trx, ctx)
      .selectFrom('memberships')
      .select(['user_id', 'roles', 'disabled_at'])
      .where('space_id', '=', ctx.spaceId)
      .where((eb) => eb.or([eb('user_id', '=', userId), isAdmin]))
      .execute();
    const target = rows.find((r) => r.user_id === userId);
    if (!target) throw new NotFoundError('No such person in this space.');

    const roles = input.roles ?? target.roles;
    const wasDisabled = target.disabled_at !== null;
    const disabled = input.disabled ?? wasDisabled;
    if (disabled && !wasDisabled && userId === ctx.userId) {
      throw new ConflictError('You cannot switch off your own access.', { disabled: ['not your own access'] });
    }

    const activeAdmins = rows.filter((r) => r.roles.includes('admin') && r.disabled_at === null);
    // The guard read the caller's roles before this lock; an admin demoted or switched off meanwhile may not go on.
    if (!activeAdmins.some((a) => a.user_id === ctx.userId)) throw new ForbiddenError();
    const adminNow = activeAdmins.some((a) => a.user_id === userId);
    const adminAfter = !disabled && roles.includes('admin');
    if (adminNow && !adminAfter && activeAdmins.length === 1) {
      throw new ConflictError('A space needs at least one admin; make someone else admin first.', {
        [roles.includes('admin') ? 'disabled' : 'roles']: ['this is the last admin of the space'],
      });
    }

    if (input.roles || disabled !== wasDisabled) {
      await scoped(trx, ctx)
        .updateTable('memberships')
        .set({ roles, disabled_at: disabled ? (target.disabled_at ?? now()) : null })
        .where('space_id', '=', ctx.spaceId)
        .where('user_id', '=', userId)
        .execute();
    }
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'person.updated',
      targetType: 'user',
      targetId: userId,
      detail: {
        ...(input.roles ? { rolesBefore: target.roles, rolesAfter: roles } : {}),
        ...(disabled !== wasDisabled ? { disabled } : {}),
      },
    });
    return toPerson(
      await peopleOf(trx, ctx.spaceId).where('memberships.user_id', '=', userId).executeTakeFirstOrThrow(),
    );
  });
}
