import 'server-only';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';

/** Makes one of the person's own spaces their current one (remembered for their next sign-in). */
export async function rememberCurrentSpace(db: Db, ctx: Ctx, spaceId: string): Promise<void> {
  if (!ctx.spaces.some((s) => s.id === spaceId)) throw new NotFoundError('No such space.');
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('users').set({ last_space_id: spaceId }).where('id', '=', ctx.userId).execute();
  });
}
