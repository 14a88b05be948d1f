import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HttpSession } from '../helpers/http';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import { apiRoutes, concrete } from '../helpers/routes';

// Every route that takes a body gets generated bodies sent as JSON: wrong types, huge strings, negative
// and non-finite numbers, unknown fields, unicode, not-JSON at all — once signed in (every role, in a
// space of its own, so valid-by-chance bodies touch nothing shared) and once anonymous. None may answer
// 5xx, and every 400, 413 and 415 names its fields. Routes that take another type (next-auth's forms,
// the upload) must refuse JSON with a 415 naming the content type — the auth routes included.

// 150 bodies per route signed in (an anonymous caller is refused before the body is read on every route but
// the public ones: 30) keeps `npm test` inside CI's time; the full 1,000 for both is
// `OHM_FUZZ_RUNS=1000 npm test -- tests/integration/fuzz-json-routes.test.ts` (about 7 minutes here).
const FULL = process.env.OHM_FUZZ_RUNS ? Number(process.env.OHM_FUZZ_RUNS) : null;
const RUNS_FOR = { 'signed in': FULL ?? 150, anonymous: FULL ?? 30 } as const;
// Not fuzzed: the test hooks move the app's clock and payment endpoints for every other test file.
const SKIP = new Set(['POST /api/test/clock', 'POST /api/payments/test-endpoint']);
const NAMES_FIELDS = new Set([400, 413, 415]);

const FIELD_NAMES = [
  'name', 'sku', 'category', 'tracking', 'specs', 'qty', 'partId', 'locationId', 'fromLocationId', 'toLocationId',
  'email', 'roles', 'lines', 'kitBoxId', 'unitIds', 'reason', 'amountMinor', 'supply', 'driver', 'string', 'volts',
  'count', 'code', 'codes', 'layoutId', 'items', 'token', 'password', 'month', 'currency', 'timeZone', 'loanDays',
  'acknowledgeCaution', 'override', 'borrowerId', 'condition', 'returnedQty', 'state', 'note', 'disabled', 'type',
  'priceMinor', 'reorderPoint', 'counts', 'restock', 'templateId', 'closingTime', 'maxOpenLoans', 'spaceId',
];

const nasty = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.constant('x'.repeat(100_000)),
  fc.integer(),
  fc.constantFrom(-1, 0, -0.0001, 1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, 2 ** 31),
  fc.double(),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 5 }),
  fc.jsonValue({ maxDepth: 3 }),
);

const body = fc.oneof(
  fc.dictionary(fc.constantFrom(...FIELD_NAMES), nasty, { maxKeys: 8 }),
  fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v)),
  fc.constantFrom('', '{', 'null', '[]', '"text"', '{"__proto__":{"x":1}}', '\u0000', '{}'.padEnd(2000, ' ')),
  fc.string({ maxLength: 200 }),
);

describe('fuzzing every JSON route', () => {
  const sessions: Record<'signed in' | 'anonymous', HttpSession> = {
    'signed in': new HttpSession(),
    anonymous: new HttpSession(),
  };
  const routes = apiRoutes()
    .filter((r) => r.door !== 'bench') // not in the test build
    .flatMap((r) => r.methods.filter((m) => m !== 'GET' && m !== 'DELETE').map((m) => ({ method: m, pattern: r.pattern })));
  const targets = routes.filter((r) => !SKIP.has(`${r.method} ${r.pattern}`));

  beforeAll(async () => {
    const db = testDb();
    const space = await makeSpace(db, { name: 'Fuzz space' });
    const user = await makeUser(db, space.id, ['member', 'steward', 'treasurer', 'admin'], 'Fuzz person');
    await sessions['signed in'].signIn(user.email, user.password);
    expect(await sessions['signed in'].isSignedIn()).toBe(true);
  });
  afterAll(closeTestDb);

  it('has JSON routes to fuzz', () => {
    expect(targets.length).toBeGreaterThan(20);
  });

  it('covers the auth catch-all and the upload', () => {
    const keys = targets.map((t) => `${t.method} ${t.pattern}`);
    expect(keys).toContain('POST /api/auth/[...nextauth]');
    expect(keys).toContain('POST /api/attachments');
  });

  for (const { method, pattern } of targets) for (const who of ['signed in', 'anonymous'] as const) {
    it(`${method} ${pattern} (${who}): no 5xx, every 400/413/415 names a field`, async () => {
      const session = sessions[who];
      const path = concrete(pattern);
      const seen = new Map<number, number>();
      await fc.assert(
        fc.asyncProperty(fc.array(body, { minLength: 8, maxLength: 8 }), async (bodies) => {
          const answers = await Promise.all(
            bodies.map(async (b) => {
              const text = typeof b === 'string' ? b : JSON.stringify(b);
              const res = await session.fetch(path, {
                method,
                headers: { 'content-type': 'application/json' },
                body: text,
              });
              const json = (await res.json().catch(() => null)) as { error?: { fields?: Record<string, unknown>; message?: string } } | null;
              return { status: res.status, json, text };
            }),
          );
          for (const a of answers) {
            seen.set(a.status, (seen.get(a.status) ?? 0) + 1);
            if (a.status >= 500) throw new Error(`${a.status} for body ${a.text.slice(0, 200)}`);
            if (NAMES_FIELDS.has(a.status) && !Object.keys(a.json?.error?.fields ?? {}).length)
              throw new Error(`${a.status} without fields for body ${a.text.slice(0, 200)}: ${JSON.stringify(a.json)}`);
          }
        }),
        { numRuns: Math.ceil(RUNS_FOR[who] / 8), endOnFailure: true },
      );
      // The signed-in caller really reached the route: no 401 from a lost session, no 403 from the origin check.
      if (who === 'signed in') expect(seen.get(401) ?? 0).toBe(0);
      if (who === 'signed in') expect(seen.get(403) ?? 0).toBe(0);
    });
  }
});
