import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { checkSymbol, encodeCode } from '@/labels/code';
import { closeTestDb, makeLocation, makePart, makeSpace, makeUnit, makeUser, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// Labels for the steward through real HTTP (issue 12): a refused code is named in plain words, not by
// an internal path; today's run is counted before anything is made; a code is found however it is
// typed (any case, any separator, without an awkward check symbol).

const db = testDb();
let steward: HttpSession;
let space: Awaited<ReturnType<typeof makeSpace>>;
let unitCode: string;
let symbolCode: string;

type ErrorBody = { error: { message: string; fields?: Record<string, string[]> } };

beforeAll(async () => {
  space = await makeSpace(db, { timeZone: 'Europe/Lisbon' });
  const user = await makeUser(db, space.id, ['steward'], 'Label steward');
  const bin = await makeLocation(db, space.id, 'Bin L1 · labels');
  const part = await makePart(db, space.id, { name: 'Test bench supply', category: 'supply', tracking: 'unit' });
  unitCode = (await makeUnit(db, space.id, part.id, bin.id)).code;
  // A unit whose code ends in one of the symbols a phone keyboard hides.
  let n = 4242;
  while (!'*~$='.includes(checkSymbol(n))) n++;
  symbolCode = encodeCode(n);
  const id = randomUUID();
  await db.insertInto('label_codes').values({ code: symbolCode, space_id: space.id, kind: 'unit', target_id: id }).execute();
  await db.insertInto('units').values({ id, space_id: space.id, part_id: part.id, code: symbolCode, location_id: bin.id }).execute();
  steward = await signedIn(user.email, user.password);
});
afterAll(closeTestDb);

describe('labels', () => {
  test('a bad code is named in plain words, without the internal path', async () => {
    const res = await steward.post('/api/labels', { selection: { kind: 'codes', codes: [unitCode, 'ab#12', encodeCode(7)] } });
    expect(res.status).toBe(400);
    const { error } = (await res.json()) as ErrorBody;
    expect(error.message).toContain('“ab#12” is not a label code');
    expect(error.message).toContain(`no label in this space has the code “${encodeCode(7)}”`);
    expect(error.message).not.toContain('selection.codes');
  });

  test('the labels page says how many labels and pages today’s run makes, before making it', async () => {
    const issued = await db
      .selectFrom('label_codes')
      .select((eb) => eb.fn.countAll<string>().as('n'))
      .where('space_id', '=', space.id)
      .executeTakeFirstOrThrow();
    const html = (await (await steward.get('/shelf/labels')).text()).replace(/<!-- -->/g, '');
    const match = /(\d+) labels? on (\d+) pages? of this sheet/.exec(html);
    expect(match?.[1]).toBe(String(issued.n));
    expect(Number(match?.[2])).toBeGreaterThanOrEqual(1);
  });

  test('a code is found typed in lower case, with separators, or without a symbol check', async () => {
    const shapes = [
      unitCode.toLowerCase(),
      `${unitCode.slice(0, 4)}.${unitCode.slice(4)}`,
      `${unitCode.slice(0, 4)} ${unitCode.slice(4).toLowerCase()}`,
      symbolCode.slice(0, 6),
      `${symbolCode.slice(0, 3)}-${symbolCode.slice(3, 6)}`.toLowerCase(),
    ];
    for (const typed of shapes) {
      const res = await steward.get(`/api/scan/${encodeURIComponent(typed)}`);
      expect(res.status, typed).toBe(200);
    }
  });
});
