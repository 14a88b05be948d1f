import 'server-only';
import { scoped } from '@/db/scoped';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { InvalidError } from '@/lib/errors';
import { monthLabel, monthOf, spaceClock, type Month } from '@/lib/sales/periods';
import { monthInput } from '@/lib/sales/schemas';

// Which month the Books show. Without one asked for, the latest month with any money in it (a sale
// started or paid, a refund booked), so the treasurer does not land on an empty month that has just
// begun; never a month that has not begun yet.

/** The latest month (space's zone) holding a sale or refund, up to `now`; the current month if none. */
export async function latestActiveMonth(db: Db, spaceId: string, now: Date): Promise<Month> {
  const { timeZone } = await spaceClock(db, spaceId);
  const row = await scoped(db, { spaceId })
    .selectFrom('sales')
    .select(
      sql<Date | null>`max(greatest(sales.created_at, coalesce(sales.paid_at, sales.created_at)))`.as('at'),
    )
    .where('space_id', '=', spaceId)
    .where('created_at', '<=', now)
    .executeTakeFirst();
  const refund = await scoped(db, { spaceId })
    .selectFrom('refunds')
    .select((eb) => eb.fn.max('created_at').as('at'))
    .where('space_id', '=', spaceId)
    .where('created_at', '<=', now)
    .executeTakeFirst();
  const times = [row?.at, refund?.at]
    .filter((d): d is Date => d instanceof Date || typeof d === 'string')
    .map((d) => new Date(d))
    .filter((d) => d <= now);
  const latest = times.length ? new Date(Math.max(...times.map((d) => d.getTime()))) : now;
  return monthOf(latest, timeZone);
}

export type MonthAsked = { ok: true; month: Month | undefined } | { ok: false; message: string };

/** Reads `?month=` as typed: a real YYYY-MM, or a sentence saying what is wrong with it. */
export function readMonth(text: string | string[] | undefined): MonthAsked {
  if (text === undefined || text === '') return { ok: true, month: undefined };
  const value = Array.isArray(text) ? text[0] : text;
  const parsed = monthInput.safeParse(value);
  if (parsed.success) return { ok: true, month: parsed.data };
  return { ok: false, message: notAMonth(value) };
}

export const notAMonth = (value: string) =>
  `“${value.slice(0, 40)}” is not a month. Write it as year and month, YYYY-MM (for example 2026-11), with the month from 01 to 12.`;

export const notBegun = (month: Month) => `${monthLabel(month)} has not begun yet, so it has no books.`;

/** The month to show: the one asked for (refused when it has not begun), else the latest with activity. */
export async function monthToShow(
  db: Db,
  spaceId: string,
  asked: Month | undefined,
  now: Date,
): Promise<Month> {
  const { timeZone } = await spaceClock(db, spaceId);
  const current = monthOf(now, timeZone);
  if (asked && asked > current) throw new InvalidError('Check month.', { month: [notBegun(asked)] });
  return asked ?? latestActiveMonth(db, spaceId, now);
}
