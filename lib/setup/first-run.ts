import 'server-only';
import { scoped } from '@/db/scoped';
import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { audit } from '@/lib/audit/log';
import { hashPassword } from '@/lib/auth/password';
import { NotFoundError } from '@/lib/errors';
import type { FirstRunInput } from './schemas';

// The first-run page exists only while no space does. Creating the first space and its admin is one
// transaction that first takes a lock on `spaces` that conflicts with itself and with any insert: two
// first-runs at once are served one after the other, and the second finds a space and gets a 404.

/** Whether the first-run page is open: no space exists yet. */
export async function firstRunOpen(db: Db): Promise<boolean> {
  const row = await db.selectFrom('spaces').select('id').limit(1).executeTakeFirst();
  return !row;
}

function slugOf(name: string): string {
  const base = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40);
  return `${base || 'space'}-${randomBytes(2).toString('hex')}`;
}

export async function createFirstSpace(db: Db, input: FirstRunInput): Promise<{ spaceId: string; userId: string }> {
  if (!(await firstRunOpen(db))) throw new NotFoundError();
  const passwordHash = await hashPassword(input.password); // slow: hashed before the lock is taken
  return db.transaction().execute(async (trx) => {
    await sql`lock table spaces in share row exclusive mode`.execute(trx);
    if (!(await firstRunOpen(trx))) throw new NotFoundError();
    const space = await trx
      .insertInto('spaces')
      .values({
        slug: slugOf(input.spaceName),
        name: input.spaceName,
        currency: input.currency,
        time_zone: input.timeZone,
        closing_time: input.closingTime,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const user = await trx
      .insertInto('users')
      .values({ email: input.adminEmail, name: input.adminName, password_hash: passwordHash, last_space_id: space.id })
      .onConflict((oc) => oc.column('email').doUpdateSet({ password_hash: passwordHash, name: input.adminName, last_space_id: space.id }))
      .returning('id')
      .executeTakeFirstOrThrow();
    await scoped(trx, { spaceId: space.id }).insertInto('memberships').values({ space_id: space.id, user_id: user.id, roles: ['admin'] }).execute();
    await audit(trx, { spaceId: space.id, actorId: user.id, action: 'space.first_run', targetType: 'space', targetId: space.id, detail: { currency: input.currency, timeZone: input.timeZone } });
    return { spaceId: space.id, userId: user.id };
  });
}
