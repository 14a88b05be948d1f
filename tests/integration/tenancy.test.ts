import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedIn, type HttpSession } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';

// A record of another space answers 404 through every route that names one — never 403, so nobody
// learns that it exists. The callers are Fernwick's steward, treasurer and admin; the records are
// Quillmere's (demo seed).

type Probe = { method: string; path: (ids: Ids) => string; body?: unknown };
type Ids = Record<'part' | 'location' | 'loan' | 'box' | 'template' | 'sale' | 'code' | 'unit' | 'person' | 'induction' | 'signoff', string>;

const PROBES: Probe[] = [
  { method: 'GET', path: (i) => `/api/parts/${i.part}` },
  { method: 'PATCH', path: (i) => `/api/parts/${i.part}`, body: { name: 'Taken over' } },
  { method: 'POST', path: (i) => `/api/parts/${i.part}/units`, body: { count: 1 } },
  { method: 'GET', path: (i) => `/api/locations/${i.location}` },
  { method: 'PATCH', path: (i) => `/api/locations/${i.location}`, body: { name: 'Taken over' } },
  { method: 'DELETE', path: (i) => `/api/locations/${i.location}` },
  { method: 'GET', path: (i) => `/api/loans/${i.loan}` },
  { method: 'POST', path: (i) => `/api/loans/${i.loan}/renew` },
  { method: 'GET', path: (i) => `/api/kits/boxes/${i.box}` },
  { method: 'GET', path: (i) => `/api/kits/templates/${i.template}` },
  { method: 'GET', path: (i) => `/api/scan/${i.code}` },
  { method: 'PATCH', path: (i) => `/api/stock/units/${i.unit}`, body: { state: 'retired', reason: 'taken over' } },
  { method: 'PATCH', path: (i) => `/api/people/${i.person}`, body: { disabled: true } },
  // Borrowing rules (issue 16)
  { method: 'PATCH', path: (i) => `/api/inductions/${i.induction}`, body: { name: 'Taken over' } },
  { method: 'POST', path: (i) => `/api/inductions/${i.induction}/signoffs`, body: { userId: '00000000-0000-4000-8000-000000000000' } },
  { method: 'DELETE', path: (i) => `/api/signoffs/${i.signoff}` },
  { method: 'POST', path: (i) => `/api/loans/${i.loan}/hand-over` },
];

describe('another space’s records answer 404', () => {
  let ids: Ids;
  const callers: Record<string, HttpSession> = {};

  beforeAll(async () => {
    const db = testDb();
    const q = await db.selectFrom('spaces').select('id').where('slug', '=', 'quillmere').executeTakeFirstOrThrow();
    const one = async (table: 'parts' | 'locations' | 'loans' | 'kit_boxes' | 'kit_templates' | 'units' | 'inductions' | 'induction_signoffs') =>
      (await db.selectFrom(table).select('id').where('space_id', '=', q.id).limit(1).executeTakeFirstOrThrow()).id;
    const code = await db.selectFrom('label_codes').select('code').where('space_id', '=', q.id).limit(1).executeTakeFirstOrThrow();
    const person = await db
      .selectFrom('users')
      .select('id')
      .where('email', '=', 'juniper@quillmere.example')
      .executeTakeFirstOrThrow();
    ids = {
      part: await one('parts'),
      location: await one('locations'),
      loan: await one('loans'),
      box: await one('kit_boxes'),
      template: await one('kit_templates'),
      unit: await one('units'),
      sale: '',
      code: code.code,
      person: person.id,
      induction: await one('inductions'),
      signoff: await one('induction_signoffs'),
    };
    for (const email of ['greta@fernwick.example', 'lorcan@fernwick.example', 'aurelio@fernwick.example']) {
      callers[email] = await signedIn(email);
    }
  });
  afterAll(closeTestDb);

  for (const probe of PROBES) {
    it(`${probe.method} ${probe.path({ part: ':part', location: ':location', loan: ':loan', box: ':box', template: ':template', sale: ':sale', code: ':code', unit: ':unit', person: ':person', induction: ':induction', signoff: ':signoff' })}`, async () => {
      for (const [email, s] of Object.entries(callers)) {
        const res = await s.fetch(probe.path(ids), {
          method: probe.method,
          headers: probe.body ? { 'content-type': 'application/json' } : {},
          body: probe.body ? JSON.stringify(probe.body) : undefined,
        });
        await res.arrayBuffer();
        // 403 is allowed only where the caller's role forbids the route everywhere (checked before the record).
        expect([404, 403], `${email} got ${res.status}`).toContain(res.status);
        if (res.status === 403) expect(email).not.toBe('aurelio@fernwick.example');
      }
    });
  }

  it('the records are really there for their own space', async () => {
    const tobiah = await signedIn('tobiah@quillmere.example');
    const res = await tobiah.get(`/api/parts/${ids.part}`);
    expect(res.status).toBe(200);
  });
});
