import 'server-only';
import type { Updateable } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { SpacesTable } from '@/db/types';
import type { Ctx } from '@/lib/auth/roles';
import { LAYOUT_IDS, type LayoutId } from '@/labels/layouts';
import { audit } from '@/lib/audit/log';
import { ConflictError, NotFoundError } from '@/lib/errors';
import type { Settings, SettingsPatch } from './schema';

// Field names in the API ↔ columns of spaces.
const COLUMNS = {
  name: 'name',
  loanDays: 'loan_days',
  closingTime: 'closing_time',
  timeZone: 'time_zone',
  currency: 'currency',
  maxOpenLoans: 'max_open_loans',
  reminderDaysBefore: 'reminder_days_before',
  reminderEveryDays: 'reminder_every_days',
  labelLayout: 'label_layout',
  ambientC: 'ambient_c',
} as const satisfies Record<keyof Settings, string>;

type Column = (typeof COLUMNS)[keyof Settings];
const COLUMN_LIST = Object.values(COLUMNS) as Column[];

/** A stored layout id no longer in labels/layouts.ts shows as the first known layout. */
const knownLayout = (id: string): LayoutId =>
  (LAYOUT_IDS as readonly string[]).includes(id) ? (id as LayoutId) : LAYOUT_IDS[0];

function toSettings(row: Record<Column, string | number>): Settings {
  return {
    name: String(row.name),
    loanDays: Number(row.loan_days),
    closingTime: String(row.closing_time),
    timeZone: String(row.time_zone),
    // char(3) comes back padded only if shorter; trim keeps the code exact either way.
    currency: String(row.currency).trim(),
    maxOpenLoans: Number(row.max_open_loans),
    reminderDaysBefore: Number(row.reminder_days_before),
    reminderEveryDays: Number(row.reminder_every_days),
    labelLayout: knownLayout(String(row.label_layout)),
    ambientC: Number(row.ambient_c),
  };
}

/** Sales carry their currency, but one space's books in two currencies cannot be reconciled month by month. */
async function refuseCurrencyChangeWithSales(db: Db, spaceId: string, current: string): Promise<void> {
  const sale = await scoped(db, { spaceId })
    .selectFrom('sales')
    .select('id')
    .where('space_id', '=', spaceId)
    .limit(1)
    .executeTakeFirst();
  if (sale) {
    throw new ConflictError(
      `This space already has sales in ${current}; its currency can no longer change.`,
      {
        currency: [`fixed at ${current} once sales exist`],
      },
    );
  }
}

/** The current space's rules. */
export async function getSettings(db: Db, ctx: Pick<Ctx, 'spaceId'>): Promise<Settings> {
  const row = await db
    .selectFrom('spaces')
    .select(COLUMN_LIST)
    .where('id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!row) throw new NotFoundError('No such space.');
  return toSettings(row);
}

/** Changes some of the current space's rules; the audit row keeps what each field was before. */
export async function updateSettings(db: Db, ctx: Ctx, patch: SettingsPatch): Promise<Settings> {
  return db.transaction().execute(async (trx) => {
    const beforeRow = await trx
      .selectFrom('spaces')
      .select(COLUMN_LIST)
      .where('id', '=', ctx.spaceId)
      .forNoKeyUpdate()
      .executeTakeFirst();
    if (!beforeRow) throw new NotFoundError('No such space.');
    const before = toSettings(beforeRow);
    const set: Partial<Record<Column, string | number>> = {};
    const changed: Record<string, { from: unknown; to: unknown }> = {};
    for (const key of Object.keys(COLUMNS) as (keyof Settings)[]) {
      const value = patch[key];
      // Compared with the stored value itself, so an unknown stored layout id is replaced when saved.
      if (value === undefined || String(value) === String(beforeRow[COLUMNS[key]]).trim()) continue;
      set[COLUMNS[key]] = value;
      changed[key] = { from: before[key], to: value };
    }
    if (set.currency !== undefined) await refuseCurrencyChangeWithSales(trx, ctx.spaceId, before.currency);
    if (!Object.keys(set).length) return before; // nothing changed: nothing to write or audit
    await trx
      .updateTable('spaces')
      .set(set as Updateable<SpacesTable>)
      .where('id', '=', ctx.spaceId)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'settings.updated',
      targetType: 'space',
      targetId: ctx.spaceId,
      detail: { changed },
    });
    return toSettings(
      await trx
        .selectFrom('spaces')
        .select(COLUMN_LIST)
        .where('id', '=', ctx.spaceId)
        .executeTakeFirstOrThrow(),
    );
  });
}
