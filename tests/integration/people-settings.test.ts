import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { errorOf, session } from './auth-fixtures';

// Settings, the admin's other page, through GET/PATCH /api/settings: every field validated and named
// on error, the change stored in one transaction with its audit row.

const db = testDb();
let spaceId: string;
let adminId: string;
let admin: HttpSession;

const patch = (body: unknown) => admin.post('/api/settings', body, 'PATCH');
const stored = () =>
  db
    .selectFrom('spaces')
    .select([
      'name',
      'loan_days',
      'closing_time',
      'time_zone',
      'currency',
      'max_open_loans',
      'reminder_days_before',
      'reminder_every_days',
      'label_layout',
      'ambient_c',
    ])
    .where('id', '=', spaceId)
    .executeTakeFirstOrThrow();

beforeAll(async () => {
  const space = await makeSpace(db, { currency: 'EUR', timeZone: 'Europe/Berlin' });
  spaceId = space.id;
  const user = await makeUser(db, spaceId, ['admin']);
  adminId = user.id;
  admin = await session(user);
});
afterAll(closeTestDb);

describe('settings', () => {
  test('GET shows the space as stored', async () => {
    const res = await admin.get('/api/settings');
    expect(res.status).toBe(200);
    const { settings } = (await res.json()) as { settings: Record<string, unknown> };
    const row = await stored();
    expect(settings).toMatchObject({
      name: row.name,
      currency: 'EUR',
      timeZone: 'Europe/Berlin',
      loanDays: row.loan_days,
      closingTime: row.closing_time,
      maxOpenLoans: row.max_open_loans,
    });
  });

  test('PATCH of every field stores them all and writes one audit row naming what changed', async () => {
    const body = {
      name: 'Renamed bench',
      loanDays: 10,
      closingTime: '19:30',
      timeZone: 'America/Chicago',
      currency: 'jpy', // stored upper-case; JPY is an ISO 4217 code (ISO 4217 list, from memory)
      maxOpenLoans: 5,
      reminderDaysBefore: 0,
      reminderEveryDays: 2,
      labelLayout: 'letter-30',
      ambientC: 18.5,
    };
    const res = await patch(body);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { settings: unknown }).settings).toEqual({ ...body, currency: 'JPY' });
    expect(await stored()).toEqual({
      name: 'Renamed bench',
      loan_days: 10,
      closing_time: '19:30',
      time_zone: 'America/Chicago',
      currency: 'JPY',
      max_open_loans: 5,
      reminder_days_before: 0,
      reminder_every_days: 2,
      label_layout: 'letter-30',
      ambient_c: 18.5,
    });
    const entry = await db
      .selectFrom('audit_log')
      .select(['actor_id', 'detail'])
      .where('space_id', '=', spaceId)
      .where('action', '=', 'settings.updated')
      .orderBy('id', 'desc')
      .executeTakeFirstOrThrow();
    expect(entry.actor_id).toBe(adminId);
    expect(entry.detail).toMatchObject({
      changed: { currency: { from: 'EUR', to: 'JPY' }, loanDays: { to: 10 } },
    });
  });

  test('a PATCH of some fields leaves the others alone; UTC is a valid zone', async () => {
    const before = await stored();
    const res = await patch({ timeZone: 'UTC', reminderEveryDays: 7 });
    expect(res.status).toBe(200);
    expect(await stored()).toEqual({ ...before, time_zone: 'UTC', reminder_every_days: 7 });
  });

  test.each([
    ['timeZone', { timeZone: 'Mars/Olympus_Mons' }],
    ['timeZone', { timeZone: '' }],
    // ISO 4217 assigns three-letter codes; ABC is not one of them (ISO 4217 list, from memory).
    ['currency', { currency: 'ABC' }],
    ['currency', { currency: 'US' }],
    ['currency', { currency: 840 }],
    ['closingTime', { closingTime: '24:00' }],
    ['closingTime', { closingTime: '9:00' }],
    ['closingTime', { closingTime: '18:60' }],
    ['loanDays', { loanDays: 0 }],
    ['loanDays', { loanDays: 1.5 }],
    ['loanDays', { loanDays: '14' }],
    ['maxOpenLoans', { maxOpenLoans: 101 }],
    ['reminderDaysBefore', { reminderDaysBefore: -1 }],
    ['reminderEveryDays', { reminderEveryDays: 0 }],
    ['labelLayout', { labelLayout: 'sheet-of-nothing' }],
    ['ambientC', { ambientC: 60.5 }],
    ['ambientC', { ambientC: '20' }],
    ['name', { name: '   ' }],
    ['(body)', {}],
    ['(body)', 'not json at all'],
  ])('a bad %s is a 400 naming it, and nothing changes', async (field, body) => {
    const before = await stored();
    const res = await patch(body);
    expect(res.status).toBe(400);
    const error = await errorOf(res);
    expect(error.code).toBe('invalid');
    expect(Object.keys(error.fields ?? {})).toEqual([field]);
    expect(await stored()).toEqual(before);
  });

  test('an unknown field is refused rather than ignored', async () => {
    const res = await patch({ loanDays: 9, colour: 'teal' });
    expect(res.status).toBe(400);
    expect(JSON.stringify((await errorOf(res)).fields)).toContain('colour');
  });

  test('the currency is fixed once the space has sales (409 naming currency)', async () => {
    const space = await makeSpace(db, { currency: 'USD' });
    const owner = await makeUser(db, space.id, ['admin']);
    const s = await session(owner);
    await db
      .insertInto('sales')
      .values({ space_id: space.id, method: 'cash', status: 'paid', currency: 'USD', total_minor: 250 })
      .execute();
    const res = await s.post('/api/settings', { currency: 'EUR' }, 'PATCH');
    expect(res.status).toBe(409);
    expect(Object.keys((await errorOf(res)).fields ?? {})).toEqual(['currency']);
    // Other rules still change.
    expect((await s.post('/api/settings', { currency: 'USD', loanDays: 21 }, 'PATCH')).status).toBe(200);
  });
});
