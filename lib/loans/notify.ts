import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { env } from '@/lib/env';
import { holdReadyMail, type BuiltMail } from '@/lib/mail/loans';
import { sendMail } from '@/lib/mail/send';
import { log } from '@/lib/log';

// "Your hold is ready" mail, sent after the return (or refill) commits. Each notice is sent under a
// row lock and marked in the same transaction, so two senders (the request and the sweep) never both
// send; a notice that failed (mail down) keeps notified_at null and the next sweep sends it.

export type SendFn = (mail: BuiltMail) => Promise<unknown>;

export async function notifyReadyHolds(
  db: Db,
  holdIds: string[] | 'all-unsent',
  send: SendFn = sendMail,
  spaceId?: string,
): Promise<number> {
  let sent = 0;
  let ids = holdIds;
  if (ids === 'all-unsent') {
    // across spaces: the scheduled sweep sends every space's unsent notices (one space's, when asked).
    let q = db
      .selectFrom('holds')
      .select('id')
      .where('status', '=', 'ready')
      .where('notified_at', 'is', null);
    if (spaceId) q = q.where('space_id', '=', spaceId);
    ids = (await q.orderBy('created_at').limit(500).execute()).map((h) => h.id);
  }
  for (const id of ids) {
    try {
      const done = await db.transaction().execute(async (trx) => {
        // across spaces: the ids come from the caller's scoped return or refill, or from the sweep above.
        const h = await trx
          .selectFrom('holds')
          .innerJoin('users', 'users.id', 'holds.user_id')
          .innerJoin('spaces', 'spaces.id', 'holds.space_id')
          .leftJoin('kit_boxes', 'kit_boxes.id', 'holds.kit_box_id')
          .leftJoin('units', 'units.id', 'holds.unit_id')
          .leftJoin('parts', 'parts.id', 'units.part_id')
          .select([
            'holds.id',
            'holds.space_id',
            'holds.kit_box_id',
            'holds.unit_id',
            'users.email',
            'users.name',
            'spaces.name as spaceName',
            'kit_boxes.name as boxName',
            'parts.name as partName',
            'units.code as unitCode',
          ])
          .where('holds.id', '=', id)
          .where('holds.status', '=', 'ready')
          .where('holds.notified_at', 'is', null)
          .forUpdate('holds')
          .skipLocked()
          .executeTakeFirst();
        if (!h) return false;
        const base = env().APP_BASE_URL;
        const url = h.kit_box_id ? `${base}/kits/boxes/${h.kit_box_id}` : `${base}/loans`;
        const itemName = h.boxName ?? `${h.partName} (${h.unitCode})`;
        await send(holdReadyMail({ to: h.email, name: h.name, spaceName: h.spaceName, itemName, url }));
        await scoped(trx, { spaceId: h.space_id }).updateTable('holds').set({ notified_at: new Date() }).where('id', '=', h.id).execute();
        return true;
      });
      if (done) sent++;
    } catch (err) {
      // Left for the next sweep; the return itself stands.
      log.error({ err: (err as Error).message }, 'hold ready notice not sent');
    }
  }
  return sent;
}
