import { TZDate } from '@date-fns/tz';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';

// Books periods are calendar months in the space's own time zone (a setting): a sale at 23:30 on the
// 31st in Chicago belongs to that month even though it is already the 1st in UTC.

export type Month = string; // 'YYYY-MM'

/** The month an instant falls in, read on the wall clock of `timeZone`. */
export function monthOf(at: Date, timeZone: string): Month {
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
  }).formatToParts(at);
  const year = parts.find((p) => p.type === 'year')!.value;
  const month = parts.find((p) => p.type === 'month')!.value;
  return `${year}-${month}`;
}

/** [from, to) of a month as instants: local midnight on the 1st to local midnight on the next 1st. */
export function monthRange(month: Month, timeZone: string): { from: Date; to: Date } {
  const [y, m] = month.split('-').map(Number);
  return {
    from: new Date(new TZDate(y, m - 1, 1, timeZone).getTime()),
    to: new Date(new TZDate(y, m, 1, timeZone).getTime()),
  };
}

export function shiftMonth(month: Month, by: number): Month {
  const [y, m] = month.split('-').map(Number);
  const index = y * 12 + (m - 1) + by;
  return `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`;
}

/** 'YYYY-MM' → the `date` value closed_periods keys on. */
export const monthKey = (month: Month) => `${month}-01`;

export function monthLabel(month: Month): string {
  const [y, m] = month.split('-').map(Number);
  return new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(
    Date.UTC(y, m - 1, 1),
  );
}

export async function spaceClock(db: Db, spaceId: string): Promise<{ timeZone: string; currency: string }> {
  const s = await db
    .selectFrom('spaces')
    .select(['time_zone', 'currency'])
    .where('id', '=', spaceId)
    .executeTakeFirstOrThrow();
  return { timeZone: s.time_zone, currency: s.currency.trim() };
}

/** True when the month holding `at` (in the space's zone) has been closed by the treasurer. */
export async function isClosedAt(db: Db, spaceId: string, at: Date): Promise<boolean> {
  const { timeZone } = await spaceClock(db, spaceId);
  const row = await scoped(db, { spaceId })
    .selectFrom('closed_periods')
    .select('month')
    .where('space_id', '=', spaceId)
    .where('month', '=', monthKey(monthOf(at, timeZone)))
    .executeTakeFirst();
  return Boolean(row);
}
