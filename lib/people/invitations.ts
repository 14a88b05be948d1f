import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Role } from '@/db/types';
import { ROLES, type Ctx } from '@/lib/auth/roles';
import { hashPassword } from '@/lib/auth/password';
import { hashToken, newToken } from '@/lib/auth/tokens';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import { sendInvitation } from '@/lib/mail/templates';
import type { AcceptInvitationInput, InviteInput } from './schema';

/** How long an invitation link works (the e-mail says 7 days). */
export const INVITATION_DAYS = 7;
const DAY_MS = 86_400_000;

export type Invitation = {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  expiresAt: Date;
  createdAt: Date;
};

const toInvitation = (r: {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  expires_at: Date;
  created_at: Date;
}): Invitation => ({
  id: r.id,
  email: r.email,
  name: r.name,
  roles: r.roles,
  expiresAt: r.expires_at,
  createdAt: r.created_at,
});

/** Invitations of the current space that can still be accepted, newest first. */
export async function listInvitations(db: Db, ctx: Pick<Ctx, 'spaceId'>): Promise<Invitation[]> {
  const rows = await scoped(db, ctx)
    .selectFrom('invitations')
    .select(['id', 'email', 'name', 'roles', 'expires_at', 'created_at'])
    .where('space_id', '=', ctx.spaceId)
    .where('accepted_at', 'is', null)
    .where('expires_at', '>', now())
    .orderBy('created_at', 'desc')
    .execute();
  return rows.map(toInvitation);
}

/**
 * Invites someone by e-mail into the current space. Only the token's hash is stored. An earlier open
 * invitation for the same address here stops working, so only the newest link is live. The e-mail is
 * sent inside the transaction: when mail is down nothing is kept and the admin can simply try again.
 */
export async function createInvitation(db: Db, ctx: Ctx, input: InviteInput): Promise<Invitation> {
  return db.transaction().execute(async (trx) => {
    const member = await scoped(trx, ctx)
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select('users.id')
      .where('memberships.space_id', '=', ctx.spaceId)
      .where('users.email', '=', input.email)
      .executeTakeFirst();
    if (member)
      throw new ConflictError(`${input.email} is already in ${ctx.spaceName}.`, {
        email: ['already in this space'],
      });

    const at = now();
    await scoped(trx, ctx)
      .updateTable('invitations')
      .set({ expires_at: at })
      .where('space_id', '=', ctx.spaceId)
      .where('email', '=', input.email)
      .where('accepted_at', 'is', null)
      .where('expires_at', '>', at)
      .execute();

    const { token, hash } = newToken();
    const row = await scoped(trx, ctx)
      .insertInto('invitations')
      .values({
        space_id: ctx.spaceId,
        email: input.email,
        name: input.name,
        roles: input.roles,
        token_hash: hash,
        invited_by: ctx.userId,
        expires_at: new Date(at.getTime() + INVITATION_DAYS * DAY_MS),
      })
      .returning(['id', 'email', 'name', 'roles', 'expires_at', 'created_at'])
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'invitation.created',
      targetType: 'invitation',
      targetId: row.id,
      detail: { email: input.email, roles: input.roles },
    });
    await sendInvitation({ email: input.email, name: input.name, spaceName: ctx.spaceName }, token);
    return toInvitation(row);
  });
}

/** Withdraws an open invitation of the current space; its link stops working at once. */
export async function withdrawInvitation(db: Db, ctx: Ctx, id: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const at = now();
    const row = await scoped(trx, ctx)
      .updateTable('invitations')
      .set({ expires_at: at })
      .where('id', '=', id)
      .where('space_id', '=', ctx.spaceId)
      .where('accepted_at', 'is', null)
      .where('expires_at', '>', at)
      .returning('email')
      .executeTakeFirst();
    if (!row) throw new NotFoundError('No open invitation with that id in this space.');
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'invitation.withdrawn',
      targetType: 'invitation',
      targetId: id,
      detail: { email: row.email },
    });
  });
}

export type OpenInvitation = {
  email: string;
  name: string;
  roles: Role[];
  spaceName: string;
  /** An account with this e-mail exists already: accepting only adds the space to it. */
  existingAccount: boolean;
};

/** What the welcome page shows for a link; null when it is unknown, used, withdrawn or expired. */
export async function findOpenInvitation(db: Db, token: string): Promise<OpenInvitation | null> {
  // across spaces: the link's token is the only key a visitor has; the invitation names its space.
  const row = await db
    .selectFrom('invitations')
    .innerJoin('spaces', 'spaces.id', 'invitations.space_id')
    .leftJoin('users', 'users.email', 'invitations.email')
    .select([
      'invitations.email',
      'invitations.name',
      'invitations.roles',
      'spaces.name as spaceName',
      'users.id as userId',
    ])
    .where('invitations.token_hash', '=', hashToken(token))
    .where('invitations.accepted_at', 'is', null)
    .where('invitations.expires_at', '>', now())
    .executeTakeFirst();
  if (!row) return null;
  return {
    email: row.email,
    name: row.name,
    roles: row.roles,
    spaceName: row.spaceName,
    existingAccount: row.userId !== null,
  };
}

export type Accepted = { userId: string; email: string; spaceId: string; newAccount: boolean };

/**
 * Uses an invitation once (a single guarded update, so two submits cannot both succeed): creates the
 * account with the chosen name and password, or adds the space to the existing account with that
 * e-mail (whose password stays as it is).
 */
export async function acceptInvitation(db: Db, input: AcceptInvitationInput): Promise<Accepted> {
  // Hash before the transaction: hashing takes tens of milliseconds and no row should stay locked meanwhile.
  const passwordHash = input.password ? await hashPassword(input.password) : null;
  return db.transaction().execute(async (trx) => {
    const at = now();
    // across spaces: as above, the token finds the invitation and with it the space.
    const inv = await trx
      .updateTable('invitations')
      .set({ accepted_at: at })
      .where('token_hash', '=', hashToken(input.token))
      .where('accepted_at', 'is', null)
      .where('expires_at', '>', at)
      .returning(['id', 'space_id', 'email', 'roles'])
      .executeTakeFirst();
    if (!inv)
      throw new NotFoundError(
        'This invitation has been used, withdrawn or has expired. Ask an admin for a new one.',
      );

    const existing = await trx
      .selectFrom('users')
      .select(['id', 'disabled_at'])
      .where('email', '=', inv.email)
      .forShare()
      .executeTakeFirst();
    let userId: string;
    if (existing) {
      if (existing.disabled_at)
        throw new ConflictError('The account with this e-mail is disabled; ask an admin.');
      userId = existing.id;
    } else {
      if (!input.name || !passwordHash) {
        throw new InvalidError('Choose your name and a password.', {
          ...(input.name ? {} : { name: ['enter a name'] }),
          ...(passwordHash ? {} : { password: ['choose a password'] }),
        });
      }
      const created = await trx
        .insertInto('users')
        .values({
          email: inv.email,
          name: input.name,
          password_hash: passwordHash,
          last_space_id: inv.space_id,
        })
        .onConflict((oc) => oc.column('email').doNothing())
        .returning('id')
        .executeTakeFirst();
      if (!created)
        throw new ConflictError('An account with this e-mail was created a moment ago; open the link again.');
      userId = created.id;
    }

    // Roles merge with any the person already holds here, kept in the fixed order of ROLES.
    const order = sql.raw(`array[${ROLES.map((r) => `'${r}'`).join(',')}]::text[]`);
    await scoped(trx, { spaceId: inv.space_id })
      .insertInto('memberships')
      .values({ space_id: inv.space_id, user_id: userId, roles: inv.roles })
      .onConflict((oc) =>
        oc.columns(['space_id', 'user_id']).doUpdateSet({
          roles: sql<
            Role[]
          >`array(select r from unnest(${order}) r where r = any(memberships.roles || excluded.roles))`,
        }),
      )
      .execute();
    await audit(trx, {
      spaceId: inv.space_id,
      actorId: userId,
      action: 'invitation.accepted',
      targetType: 'invitation',
      targetId: inv.id,
      detail: { email: inv.email, roles: inv.roles, newAccount: !existing },
    });
    return { userId, email: inv.email, spaceId: inv.space_id, newAccount: !existing };
  });
}
