import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
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
  disabled: boolean;
  joinedAt: Date;
};

const isAdmin = sql<boolean>`'admin' = any(memberships.roles)`;

function peopleOf(db: Db, spaceId: string) {
  return db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select([
      'users.id',
      'users.name',
      'users.email',
      'users.disabled_at',
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
 * Changes a person's roles in the current space and/or disables or enables their account.
 * A person outside the space is 404. Every space keeps at least one enabled admin (409 otherwise):
 * disabling is per account, so it is checked in each space where the person is an admin.
 */
export async function updatePerson(
  db: Db,
  ctx: Ctx,
  userId: string,
  input: UpdatePersonInput,
): Promise<Person> {
  return db.transaction().execute(async (trx) => {
    // Admin changes are serialised per space by locking the spaces involved (here, and wherever the
    // target is an admin, since disabling is per account) in id order, so two admins demoting each
    // other at the same moment cannot both succeed, and cannot deadlock. NO KEY UPDATE does not block
    // inserts elsewhere that merely reference the space.
    const adminIn = await trx
      .selectFrom('memberships')
      .select('space_id')
      .where('user_id', '=', userId)
      .where(isAdmin)
      .execute();
    const spaceIds = [...new Set([ctx.spaceId, ...adminIn.map((r) => r.space_id)])];
    await trx
      .selectFrom('spaces')
      .select('id')
      .where('id', 'in', spaceIds)
      .orderBy('id')
      .forNoKeyUpdate()
      .execute();
    // Read after the lock: in READ COMMITTED this statement sees whatever the previous holder committed.
    const rows = await trx
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select(['memberships.space_id', 'memberships.user_id', 'memberships.roles', 'users.disabled_at'])
      .where('memberships.space_id', 'in', spaceIds)
      .where((eb) => eb.or([eb('memberships.user_id', '=', userId), isAdmin]))
      .execute();
    const target = rows.find((r) => r.space_id === ctx.spaceId && r.user_id === userId);
    if (!target) throw new NotFoundError('No such person in this space.');

    const roles = input.roles ?? target.roles;
    const wasDisabled = target.disabled_at !== null;
    const disabled = input.disabled ?? wasDisabled;
    if (disabled && !wasDisabled && userId === ctx.userId) {
      throw new ConflictError('You cannot disable your own account.', { disabled: ['not your own account'] });
    }

    const admins = rows.filter((r) => r.roles.includes('admin'));
    // The guard read the caller's roles before this lock; an admin demoted meanwhile may not go on.
    if (
      !admins.some((a) => a.space_id === ctx.spaceId && a.user_id === ctx.userId && a.disabled_at === null)
    ) {
      throw new ForbiddenError();
    }
    const adminAfter = (spaceId: string) =>
      !disabled && (spaceId === ctx.spaceId ? roles.includes('admin') : true);
    // Only spaces where this person is an enabled admin now can lose their last admin through this change.
    const adminNow = wasDisabled ? [] : admins.filter((a) => a.user_id === userId).map((a) => a.space_id);
    for (const spaceId of adminNow) {
      const others = admins.filter(
        (a) => a.space_id === spaceId && a.user_id !== userId && a.disabled_at === null,
      );
      if (!adminAfter(spaceId) && others.length === 0) {
        const here = spaceId === ctx.spaceId;
        throw new ConflictError(
          here
            ? 'A space needs at least one admin; make someone else admin first.'
            : 'This person is the last admin of another space; disabling the account would leave it without one.',
          {
            [here && !roles.includes('admin') ? 'roles' : 'disabled']: ['this is the last admin of a space'],
          },
        );
      }
    }

    if (input.roles) {
      await trx
        .updateTable('memberships')
        .set({ roles })
        .where('space_id', '=', ctx.spaceId)
        .where('user_id', '=', userId)
        .execute();
    }
    if (disabled !== wasDisabled) {
      await trx
        .updateTable('users')
        .set({ disabled_at: disabled ? now() : null })
        .where('id', '=', userId)
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
