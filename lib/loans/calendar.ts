import 'server-only';
import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import { createEvents, type EventAttributes } from 'ics';
import type { Db } from '@/db/connect';
import { NotFoundError } from '@/lib/errors';

// A private iCalendar feed of a person's due dates, for their phone's calendar. The URL carries a
// random secret (users.calendar_token): anyone with the link can read the due dates, nobody can change
// anything, and making a new link revokes the old one.

const newToken = () => randomBytes(24).toString('base64url');
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{32}$/;

/** The person's current feed token, or null before they ask for one (reading writes nothing). */
export async function calendarToken(db: Db, userId: string): Promise<string | null> {
  const row = await db
    .selectFrom('users')
    .select('calendar_token')
    .where('id', '=', userId)
    .executeTakeFirst();
  return row?.calendar_token ?? null;
}

/** A new token (the first one, or one that replaces and so revokes the old). */
export async function rotateCalendarToken(db: Db, userId: string): Promise<string> {
  const token = newToken();
  await db.updateTable('users').set({ calendar_token: token }).where('id', '=', userId).execute();
  return token;
}

/** The feed for a token; NotFoundError for a token nobody has (or a malformed one). */
export async function calendarFeed(db: Db, token: string, baseUrl: string): Promise<string> {
  if (!TOKEN_SHAPE.test(token)) throw new NotFoundError('No such calendar.');
  const user = await db
    .selectFrom('users')
    .select(['id', 'name'])
    .where('calendar_token', '=', token)
    .where('disabled_at', 'is', null)
    .executeTakeFirst();
  if (!user) throw new NotFoundError('No such calendar.');
  // across spaces: one person's feed lists their loans in every space where their access is on.
  const loans = await db
    .selectFrom('loans')
    .innerJoin('spaces', 'spaces.id', 'loans.space_id')
    // Only spaces where the person's access is still on: a space that switched them off shows nothing.
    .innerJoin('memberships', (j) =>
      j.onRef('memberships.space_id', '=', 'loans.space_id').onRef('memberships.user_id', '=', 'loans.borrower_id'),
    )
    .where('memberships.disabled_at', 'is', null)
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select([
      'loans.id',
      'loans.due_at',
      'loans.out_at',
      'spaces.name as spaceName',
      'kit_boxes.name as boxName',
      sql<string>`(select string_agg(case when ll.qty > 1 then ll.qty || ' × ' || p.name else p.name end, E'\\n' order by p.name)
        from loan_lines ll join parts p on p.space_id = ll.space_id and p.id = ll.part_id
        where ll.space_id = loans.space_id and ll.loan_id = loans.id)`.as('contents'),
    ])
    .where('loans.borrower_id', '=', user.id)
    .where('loans.status', '=', 'out')
    .orderBy('loans.due_at')
    .execute();
  const events: EventAttributes[] = loans.map((l) => ({
    uid: `loan-${l.id}@ohmstead`,
    title: `Due back: ${l.boxName ?? 'borrowed parts'} (${l.spaceName})`,
    description: `Bring back to ${l.spaceName}:\n${l.contents ?? ''}`,
    start: l.due_at.getTime(),
    startInputType: 'utc',
    startOutputType: 'utc',
    duration: { minutes: 15 },
    url: `${baseUrl}/loans/${l.id}`,
    status: 'CONFIRMED',
    busyStatus: 'FREE',
    created: l.out_at.getTime(),
    alarms: [
      { action: 'display', description: 'Loan due back tomorrow', trigger: { hours: 24, before: true } },
    ],
  }));
  const { error, value } = createEvents(events, {
    productId: 'ohmstead/loans',
    calName: `Ohmstead loans of ${user.name}`,
  });
  if (error || !value) throw error ?? new Error('calendar could not be written');
  return value;
}
